// The format-2 migration upgrades what format 1 stored: own operations, residue grazing, crops.
import { readFileSync } from 'node:fs';
import { eq, sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { cropPractices, crops, farms, fieldOperations } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';

const db = testDb();

/** The data statements of drizzle/0001_format-2.sql: those after its schema changes. */
function upgradeStatements(): string[] {
	const text = readFileSync('drizzle/0001_format-2.sql', 'utf8');
	return text
		.split('--> statement-breakpoint')
		.map((s) => s.trim())
		.filter((s) => /^(--[^\n]*\n)*\s*(UPDATE|INSERT)/.test(s));
}

class RollBack extends Error {}

describe('migration to plan format 2', () => {
	it('has the three data statements', () => {
		expect(upgradeStatements()).toHaveLength(3);
	});

	it('upgrades rows stored under format 1, and the transaction leaves nothing behind', async () => {
		let seen: Record<string, unknown> = {};
		await expect(
			db.transaction(async (tx) => {
				const [farm] = await tx
					.insert(farms)
					.values({
						name: 'Migration check',
						labourHoursAvailableByMonth: new Array(12).fill(100),
						interestRatePercent: 5
					})
					.returning({ id: farms.id });
				// As format 1 stored them: no statedAs, leafHuskLbDmPerBu in the practice's detail
				await tx.insert(fieldOperations).values({
					farmId: farm.id,
					key: 'planter',
					name: 'Planter',
					by: 'own',
					month: 5,
					speedMph: 5,
					widthFt: 20,
					fieldEfficiencyPercent: 65,
					fuelBasis: 'per-acre',
					dieselGallonsPerAcre: 0.35,
					labourFactor: 1.1,
					repairsUsdPerAcre: 4
				});
				await tx.insert(cropPractices).values({
					farmId: farm.id,
					key: 'corn',
					name: 'Corn',
					crop: 'corn',
					yieldGoalPerAcre: 180,
					otherFertiliserUsdPerAcre: 0,
					chemicalsUsdPerAcre: 0,
					otherDirectUsdPerAcre: 0,
					detail: { residueGrazing: { leafHuskLbDmPerBu: 14, utilisationPercent: 50 } } as never
				});
				for (const statement of upgradeStatements()) await tx.execute(sql.raw(statement));
				const [op] = await tx
					.select({ statedAs: fieldOperations.statedAs })
					.from(fieldOperations)
					.where(eq(fieldOperations.farmId, farm.id));
				const [practice] = await tx
					.select({ detail: cropPractices.detail })
					.from(cropPractices)
					.where(eq(cropPractices.farmId, farm.id));
				const farmCrops = await tx
					.select({ key: crops.key, lbPerUnit: crops.lbPerUnit })
					.from(crops)
					.where(eq(crops.farmId, farm.id));
				seen = { op, practice, farmCrops, farmId: farm.id };
				throw new RollBack();
			})
		).rejects.toBeInstanceOf(RollBack);

		expect(seen.op).toEqual({ statedAs: 'machine' });
		expect(seen.practice).toEqual({
			detail: { residueGrazing: { leafHuskLbDmPerUnit: 14, utilisationPercent: 50 } }
		});
		// Univ. of Missouri G4020: corn 56 lb a bushel, among the eight built-in crops
		const farmCrops = seen.farmCrops as { key: string; lbPerUnit: number }[];
		expect(farmCrops).toHaveLength(8);
		expect(farmCrops).toContainEqual({ key: 'corn', lbPerUnit: 56 });
		const left = await db
			.select({ id: farms.id })
			.from(farms)
			.where(eq(farms.id, seen.farmId as string));
		expect(left).toEqual([]);
	});
});
