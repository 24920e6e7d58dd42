import { and, asc, eq, inArray } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { Db, Tx } from './client';
import { priceSetItems, priceSets } from './schema';

type PriceSetInput = PlanDocumentInput['priceSets'][number];
type PriceItem = Omit<typeof priceSetItems.$inferInsert, 'priceSetId'>;

/** Adds the price sets of years the farm has none for yet, each with its items, in one transaction. */
export async function insertPriceSets(
	db: Db | Tx,
	farmId: string,
	sets: PlanDocument['priceSets']
) {
	await db.transaction(async (tx) => {
		for (const set of sets) {
			const [row] = await tx
				.insert(priceSets)
				.values({
					farmId,
					year: set.year,
					nitrogenUsdPerLb: set.nitrogenUsdPerLb,
					dieselUsdPerGallon: set.dieselUsdPerGallon,
					labourUsdPerHour: set.labourUsdPerHour,
					hayUsdPerBale: set.hayUsdPerBale
				})
				.onConflictDoNothing()
				.returning({ id: priceSets.id });
			if (!row) continue;
			const items = itemsOf(set);
			if (items.length) {
				await tx
					.insert(priceSetItems)
					.values(items.map((item) => ({ ...item, priceSetId: row.id })));
			}
		}
	});
}

/** The farm's price sets by year with their crop prices, as the farm data page shows them. */
export async function listPriceSetsByFarm(db: Db | Tx, farmId: string) {
	return db.query.priceSets.findMany({
		columns: {
			id: true,
			year: true,
			nitrogenUsdPerLb: true,
			dieselUsdPerGallon: true,
			labourUsdPerHour: true,
			hayUsdPerBale: true
		},
		where: eq(priceSets.farmId, farmId),
		orderBy: asc(priceSets.year),
		with: {
			items: {
				columns: { key: true, priceUsd: true },
				where: eq(priceSetItems.kind, 'crop')
			}
		}
	});
}

/** The farm's price sets for the given years, as the plan file states them. */
export async function exportPriceSets(
	db: Db | Tx,
	farmId: string,
	years: number[]
): Promise<PriceSetInput[]> {
	const rows = await db.query.priceSets.findMany({
		where: and(eq(priceSets.farmId, farmId), inArray(priceSets.year, years)),
		orderBy: asc(priceSets.year),
		with: { items: true }
	});
	return rows.map(priceSetOf);
}

function itemsOf(set: PlanDocument['priceSets'][number]): PriceItem[] {
	return [
		...Object.entries(set.cropPricesUsdPerUnit).map(([key, priceUsd]) => ({
			kind: 'crop' as const,
			key,
			priceUsd
		})),
		...Object.entries(set.seedPrices).flatMap(([key, price]) => [
			...(price.usdPerThousandSeeds === undefined
				? []
				: [{ kind: 'seed-per-thousand-seeds' as const, key, priceUsd: price.usdPerThousandSeeds }]),
			...(price.usdPerLb === undefined
				? []
				: [{ kind: 'seed-per-lb' as const, key, priceUsd: price.usdPerLb }])
		]),
		...Object.entries(set.customRatesUsdPerAcre).map(([key, priceUsd]) => ({
			kind: 'custom-rate-per-acre' as const,
			key,
			priceUsd
		}))
	];
}

function priceSetOf(
	set: typeof priceSets.$inferSelect & { items: (typeof priceSetItems.$inferSelect)[] }
): PriceSetInput {
	const of = (kind: (typeof priceSetItems.$inferSelect)['kind']) =>
		set.items.filter((item) => item.kind === kind);
	const seedPrices: Record<string, { usdPerThousandSeeds?: number; usdPerLb?: number }> = {};
	for (const item of of('seed-per-thousand-seeds')) {
		seedPrices[item.key] = { ...seedPrices[item.key], usdPerThousandSeeds: item.priceUsd };
	}
	for (const item of of('seed-per-lb')) {
		seedPrices[item.key] = { ...seedPrices[item.key], usdPerLb: item.priceUsd };
	}
	return {
		year: set.year,
		cropPricesUsdPerUnit: Object.fromEntries(of('crop').map((i) => [i.key, i.priceUsd])),
		nitrogenUsdPerLb: set.nitrogenUsdPerLb,
		dieselUsdPerGallon: set.dieselUsdPerGallon,
		labourUsdPerHour: set.labourUsdPerHour,
		hayUsdPerBale: set.hayUsdPerBale,
		seedPrices,
		customRatesUsdPerAcre: Object.fromEntries(
			of('custom-rate-per-acre').map((i) => [i.key, i.priceUsd])
		)
	};
}
