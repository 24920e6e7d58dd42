// The database holds everything a plan file says: a scenario imported into a farm and exported again
// is the same plan.
import { readdirSync, readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { exportPlanDocument, importPlanDocument } from '../../src/lib/server/db/plan-documents';
import { farms } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';

const db = testDb();

function parsed(input: unknown): PlanDocument {
	const result = parsePlanDocument(input);
	if (!result.ok) throw new Error(JSON.stringify(result.issues));
	return result.plan;
}

/** The same plan whatever order its lists come in. */
function normalised(doc: PlanDocument) {
	const byId = <T extends { id: string }>(items: T[]) =>
		[...items].sort((a, b) => a.id.localeCompare(b.id));
	return {
		...doc,
		fields: byId(doc.fields),
		operations: byId(doc.operations),
		practices: byId(doc.practices),
		rotations: byId(doc.rotations),
		priceSets: [...doc.priceSets].sort((a, b) => a.year - b.year),
		plan: {
			...doc.plan,
			fieldRotations: [...doc.plan.fieldRotations].sort((a, b) =>
				a.fieldId.localeCompare(b.fieldId)
			)
		}
	};
}

const scenarios = readdirSync('scenarios').filter((file) => file.endsWith('.json'));

describe('plan documents in the database', () => {
	it.each(scenarios)('scenarios/%s comes back out as it went in', async (file) => {
		const original = parsed(JSON.parse(readFileSync(`scenarios/${file}`, 'utf8')));
		const planId = await db.transaction(async (tx) => {
			const [farm] = await tx.insert(farms).values(original.farm).returning({ id: farms.id });
			const { planId } = await importPlanDocument(tx, {
				farmId: farm.id,
				userId: null,
				doc: original,
				isReference: false
			});
			return planId;
		});
		const exported = parsed(await exportPlanDocument(db, planId));
		expect(normalised(exported)).toEqual(normalised(original));
		// Every export of a plan is the same file: its price maps list their keys in order (the
		// database's C collation and JavaScript's sort agree), not as the rows happen to come back.
		for (const set of exported.priceSets) {
			for (const prices of [set.cropPricesUsdPerUnit, set.seedPrices, set.customRatesUsdPerAcre]) {
				expect(Object.keys(prices)).toEqual(Object.keys(prices).sort());
			}
		}
	});
});

/** Numbers to 6 decimals, so sums taken in another field order compare equal. */
const rounded = (value: unknown) =>
	JSON.parse(JSON.stringify(value, (_k, v) => (typeof v === 'number' ? Number(v.toFixed(6)) : v)));

describe('the seeded demo farm', () => {
	it.each(scenarios)(
		'holds scenarios/%s: its plan evaluates to the same farm-years',
		async (file) => {
			const original = parsed(JSON.parse(readFileSync(`scenarios/${file}`, 'utf8')));
			const farm = await db.query.farms.findFirst({
				where: eq(farms.name, 'Maple Coulee Farm'),
				with: { plans: true }
			});
			const plan = farm?.plans.find((p) => p.name === original.plan.name);
			expect(plan?.isReference).toBe(file === 'reference.json');
			const exported = parsed(await exportPlanDocument(db, plan!.id));
			expect(rounded(evaluatePlan(exported).farmYears)).toEqual(
				rounded(evaluatePlan(original).farmYears)
			);
		}
	);
});
