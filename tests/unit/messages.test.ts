import { describe, expect, it } from 'vitest';
import { registerSchema, signInSchema } from '../../src/lib/schemas/account';
import { farmSchema } from '../../src/lib/schemas/farm';
import { toFieldIssues } from '../../src/lib/schemas/issues';
import { amount, month, percent } from '../../src/lib/schemas/messages';
import { parsePlanDocument, type PlanDocumentInput } from '../../src/lib/schemas/plan-file';
import { smallPlanInput } from './fixtures';

/** The English zod writes by itself (zod 4's en locale); none of it may reach a person. */
const zodDefault =
	/Invalid input|Too (big|small)|expected .*, received|Unrecognized key|Invalid (option|discriminator|string|number|element|key|value)/;

/** The small plan with every kind of part: a crop of its own and an operation stated per acre. */
function everyKindOfPart(): PlanDocumentInput {
	const input = smallPlanInput();
	input.crops = [{ id: 'flax', name: 'Flax', soldBy: 'bu', lbPerUnit: 56 }];
	input.operations!.push({
		id: 'roll',
		name: 'Roller',
		by: 'own',
		statedAs: 'per-acre',
		month: 4,
		dieselGallonsPerAcre: 0.2,
		machineHoursPerAcre: 0.05,
		labourHoursPerAcre: 0.06
	});
	input.practices[1].operations!.push({ operationId: 'roll' });
	return input;
}

type Json = unknown;

/** Every path to a value a person fills in (numbers, text, true/false) in a document. */
function leafPaths(value: Json, path: (string | number)[] = []): (string | number)[][] {
	if (Array.isArray(value)) return value.flatMap((v, i) => leafPaths(v, [...path, i]));
	if (value !== null && typeof value === 'object') {
		return Object.entries(value).flatMap(([k, v]) => leafPaths(v, [...path, k]));
	}
	return [path];
}

function withValue(doc: Json, path: (string | number)[], value: Json): Json {
	const copy = structuredClone(doc) as Record<string | number, Json>;
	let node = copy;
	for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, Json>;
	const last = path[path.length - 1];
	if (value === undefined) delete node[last];
	else node[last] = value;
	return copy;
}

function messagesFor(input: Json): string[] {
	const result = parsePlanDocument(input);
	return result.ok ? [] : result.issues.map((i) => `${i.path}: ${i.message}`);
}

describe('validation messages speak one voice', () => {
	const doc = everyKindOfPart();
	const paths = leafPaths(doc).filter((p) => p[0] !== 'formatVersion');

	it('walks every value of a document with every kind of part', () => {
		expect(paths.length).toBeGreaterThan(140);
		expect(parsePlanDocument(doc).ok).toBe(true);
	});

	it('never lets zod’s own words through, whatever a value is replaced with', () => {
		const replacements: Json[] = [
			'x',
			-1e15,
			1e15,
			0.5,
			true,
			null,
			[],
			{},
			undefined,
			'',
			'a'.repeat(5000)
		];
		const leaks: string[] = [];
		let refused = 0;
		for (const path of paths) {
			for (const replacement of replacements) {
				const messages = messagesFor(withValue(doc, path, replacement));
				if (messages.length) refused++;
				leaks.push(...messages.filter((m) => zodDefault.test(m)));
			}
		}
		expect(leaks).toEqual([]);
		// most replacements are refused: the walk really reached the schema's checks
		expect(refused).toBeGreaterThan(paths.length * 5);
	});

	it('words unknown keys and a wrong kind of part in its own words', () => {
		const messages = [
			...messagesFor({ ...doc, fieldz: [] }),
			...messagesFor({ ...doc, herd: [] }),
			...messagesFor({ ...doc, fields: 'north' }),
			...messagesFor(withValue(doc, ['operations', 0, 'by'], 'neighbour'))
		];
		expect(messages.length).toBeGreaterThanOrEqual(4);
		expect(messages.filter((m) => zodDefault.test(m))).toEqual([]);
		expect(messages).toContain(
			'(document): Unknown key "fieldz": check the spelling against the plan format.'
		);
	});

	it('names the value and its range in each bound', () => {
		const error = (schema: { safeParse: (v: unknown) => { error?: unknown } }, value: unknown) =>
			toFieldIssues(schema.safeParse(value).error as never)[0].message;
		expect(error(amount('field area', { min: 0.01, max: 20_000, unit: 'acres' }), 30_000)).toBe(
			'Field area must be at most 20,000 acres.'
		);
		expect(error(amount('the hay price', { min: 0, max: 2000, usdPer: 'bale' }), -1)).toBe(
			'The hay price must be at least $0 per bale.'
		);
		expect(error(percent('feeding waste', { max: 60 }), 75)).toBe(
			'Feeding waste must be at most 60 %.'
		);
		expect(error(month('the month'), 13)).toBe(
			'The month must be a month from 1 (January) to 12 (December).'
		);
	});

	it('keeps the farm form and the account forms in the same voice', () => {
		const farm = farmSchema.safeParse({ name: 7, labourHoursAvailableByMonth: 'x', extra: 1 });
		const signIn = signInSchema.safeParse({ email: 3 });
		const register = registerSchema.safeParse({});
		const all = [farm, signIn, register].flatMap((r) =>
			r.success ? [] : toFieldIssues(r.error).map((i) => i.message)
		);
		expect(all.length).toBeGreaterThan(5);
		expect(all.filter((m) => zodDefault.test(m))).toEqual([]);
	});
});
