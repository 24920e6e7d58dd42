// A whole farm of any size for the optimiser's tests and bench: the demo scenarios' practices, operations
// and prices (invented demo data), with generated fields and up to ten rotations of those practices.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';

const scenarioNames = ['reference', 'reduced-n', 'small-grain-peas', 'wide-row-interseeded'];

// Rotations of the scenarios' practices, the scenarios' own four first.
const rotationPractices: [string, string[]][] = [
	['corn-soybean', ['corn-30in-full-n', 'soybean-15in']],
	['wide-corn-soybean', ['corn-60in-interseeded', 'soybean-15in']],
	['corn-soybean-wheat', ['corn-90-n', 'soybean-15in-rye', 'spring-wheat-red-clover']],
	['corn-soybean-oatpea', ['corn-after-cover-eonr', 'soybean-15in', 'oat-pea-forage-grazed-cover']],
	['corn-low-n-soybean', ['corn-90-n', 'soybean-15in']],
	['wide-corn-soybean-rye', ['corn-60in-interseeded', 'soybean-15in-rye']],
	['continuous-corn', ['corn-30in-full-n']],
	['corn-corn-soybean', ['corn-30in-full-n', 'corn-90-n', 'soybean-15in-rye']],
	['wheat-corn-soybean', ['spring-wheat-red-clover', 'corn-after-cover-eonr', 'soybean-15in']],
	[
		'oatpea-wide-corn-soybean',
		['oat-pea-forage-grazed-cover', 'corn-60in-interseeded', 'soybean-15in']
	]
];

function scenario(name: string) {
	return JSON.parse(readFileSync(resolve(`scenarios/${name}.json`), 'utf8'));
}

/**
 * `fields` fields (acres, productivity and prior crop varied deterministically) and the first
 * `rotations` rotations, every field starting on the demo reference plan's corn–soybean.
 */
export function generatedFarm(
	fields: number,
	rotations: number,
	{ herdHead = 60 }: { herdHead?: number } = {}
): PlanDocument {
	const docs = scenarioNames.map(scenario);
	const base = docs[0];
	const practices = new Map<string, unknown>();
	for (const doc of docs) for (const p of doc.practices) practices.set(p.id, p);
	const templates = base.fields;
	// The demo farm's family hours are for its 14 fields: a larger farm hires help in proportion.
	// Each hand works up to 1.9 times the family's hours (a month has at most 744).
	const handShare = 1.9;
	const hiredPeople = Math.ceil((fields / base.fields.length - 1) / handShare);
	const document = {
		...base,
		people: Array.from({ length: hiredPeople }, (_, i) => ({
			id: `hand-${i + 1}`,
			name: `Hired hand ${i + 1}`,
			role: 'hired',
			hoursAvailableByMonth: base.farm.labourHoursAvailableByMonth.map((hours: number) =>
				Math.min(744, hours * handShare)
			),
			wageUsdPerHour: 22
		})),
		fields: Array.from({ length: fields }, (_, i) => {
			const template = templates[i % templates.length];
			return {
				...template,
				id: `field-${i + 1}`,
				name: `Field ${i + 1}`,
				acres: 15 + ((i * 37) % 70),
				productivityIndex: 0.85 + ((i * 13) % 30) / 100
			};
		}),
		herd: base.herd ? { ...base.herd, head: herdHead } : null,
		practices: [...practices.values()],
		rotations: rotationPractices
			.slice(0, rotations)
			.map(([id, ids]) => ({ id, name: id.replaceAll('-', ' '), practices: ids })),
		plan: {
			...base.plan,
			name: `Generated farm, ${fields} fields × ${rotations} rotations`,
			fieldRotations: Array.from({ length: fields }, (_, i) => ({
				fieldId: `field-${i + 1}`,
				rotationId: 'corn-soybean',
				startingPhase: (i % 2) + 1
			}))
		}
	};
	const parsed = parsePlanDocument(document);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues.slice(0, 5)));
	return parsed.plan;
}
