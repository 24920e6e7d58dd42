import { asc, eq } from 'drizzle-orm';
import { db } from '.';
import {
	cropPractices,
	fieldOperations,
	fields,
	herds,
	plans,
	priceSets,
	rotations
} from './schema';

/** Everything a farm has set up, for the read-only farm data page. */
export async function getFarmData(farmId: string) {
	const [fieldRows, herd, priceSetRows, operationRows, practiceRows, rotationRows, planRows] =
		await Promise.all([
			db.query.fields.findMany({ where: eq(fields.farmId, farmId), orderBy: asc(fields.name) }),
			db.query.herds.findFirst({ where: eq(herds.farmId, farmId) }),
			db.query.priceSets.findMany({
				where: eq(priceSets.farmId, farmId),
				orderBy: asc(priceSets.year),
				with: { items: true }
			}),
			db.query.fieldOperations.findMany({
				where: eq(fieldOperations.farmId, farmId),
				orderBy: [asc(fieldOperations.month), asc(fieldOperations.name)]
			}),
			db.query.cropPractices.findMany({
				where: eq(cropPractices.farmId, farmId),
				orderBy: asc(cropPractices.name)
			}),
			db.query.rotations.findMany({
				where: eq(rotations.farmId, farmId),
				orderBy: asc(rotations.name),
				with: { steps: { with: { practice: { columns: { name: true } } } } }
			}),
			db.query.plans.findMany({
				where: eq(plans.farmId, farmId),
				orderBy: [asc(plans.name)],
				with: { versions: { columns: { version: true, startYear: true, years: true } } }
			})
		]);
	return {
		fields: fieldRows,
		herd: herd ?? null,
		priceSets: priceSetRows,
		operations: operationRows,
		practices: practiceRows,
		rotations: rotationRows.map((rotation) => ({
			...rotation,
			steps: rotation.steps
				.sort((a, b) => a.position - b.position)
				.map((step) => step.practice.name)
		})),
		plans: planRows.map((plan) => {
			const current = plan.versions.find((v) => v.version === plan.currentVersion);
			return { ...plan, startYear: current?.startYear, years: current?.years };
		})
	};
}
