import { and, asc, eq, gt, inArray, lte, ne, sql } from 'drizzle-orm';
import type { PlanDocument, PlanDocumentInput } from '$lib/schemas/plan-file';
import type { PriceSet } from '$lib/schemas/price-sets';
import { insertAuditEntry } from './audit';
import type { Db, Tx } from './client';
import { isRowId } from './keys';
import {
	cropPractices,
	fieldOperations,
	plans,
	planVersions,
	priceSetItems,
	priceSets
} from './schema';

type PriceSetInput = PlanDocumentInput['priceSets'][number];
type PriceItem = Omit<typeof priceSetItems.$inferInsert, 'priceSetId'>;

/** A stored price set as the API and the prices pages give it: the row id, then the plan file's set. */
export type PriceSetRow = { id: string } & PriceSet;

/** Adds the price sets of years the farm has none for yet, each with its items (plan-file import). */
export async function insertPriceSets(
	db: Db | Tx,
	farmId: string,
	sets: PlanDocument['priceSets']
) {
	await db.transaction(async (tx) => {
		for (const set of sets) await insertSetRows(tx, farmId, set);
	});
}

/**
 * Adds validated price sets, each with its items and an audit entry, in one transaction: all of them,
 * or (the database as it was) none and the years the farm already has a set for, or that come twice.
 */
export async function createPriceSets(
	db: Db | Tx,
	farmId: string,
	userId: string,
	sets: readonly PriceSet[]
): Promise<{ ok: true; priceSets: PriceSetRow[] } | { ok: false; takenYears: number[] }> {
	try {
		const ids = await db.transaction(async (tx) => {
			const added: string[] = [];
			const takenYears: number[] = [];
			for (const set of sets) {
				const id = await insertSetRows(tx, farmId, set);
				if (id === undefined) {
					takenYears.push(set.year);
					continue;
				}
				added.push(id);
				await insertAuditEntry(tx, {
					farmId,
					userId,
					action: 'price-set.created',
					detail: { priceSetId: id, year: set.year }
				});
			}
			if (takenYears.length) throw new YearsTaken(takenYears);
			return added;
		});
		return { ok: true, priceSets: await listPriceSets(db, farmId, ids) };
	} catch (err) {
		if (err instanceof YearsTaken) return { ok: false, takenYears: err.years };
		throw err;
	}
}

/** The farm's price sets by year, or those with the given ids. */
export async function listPriceSets(
	db: Db | Tx,
	farmId: string,
	ids?: readonly string[]
): Promise<PriceSetRow[]> {
	if (ids && !ids.length) return [];
	const rows = await db.query.priceSets.findMany({
		where: and(eq(priceSets.farmId, farmId), ids ? inArray(priceSets.id, [...ids]) : undefined),
		orderBy: asc(priceSets.year),
		with: { items: { orderBy: asc(priceSetItems.key) } }
	});
	return rows.map((row) => ({ id: row.id, ...priceSetOf(row) }));
}

/** One of the farm's price sets; undefined for another farm's set or an id that is not a UUID. */
export async function findPriceSetById(
	db: Db | Tx,
	farmId: string,
	priceSetId: string
): Promise<PriceSetRow | undefined> {
	if (!isRowId(priceSetId)) return undefined;
	const [set] = await listPriceSets(db, farmId, [priceSetId]);
	return set;
}

/**
 * Replaces a set's prices and items (the year may change, to one the farm has no set for) and records
 * who did it, in one transaction; the year when another set has it (nothing changed).
 */
export async function updatePriceSet(
	db: Db | Tx,
	farmId: string,
	userId: string,
	priceSetId: string,
	set: PriceSet
): Promise<{ ok: true; priceSet: PriceSetRow } | { ok: false; takenYears: number[] }> {
	try {
		await db.transaction(async (tx) => {
			const [other] = await tx
				.select({ id: priceSets.id })
				.from(priceSets)
				.where(
					and(
						eq(priceSets.farmId, farmId),
						eq(priceSets.year, set.year),
						ne(priceSets.id, priceSetId)
					)
				);
			if (other) throw new YearsTaken([set.year]);
			await tx
				.update(priceSets)
				.set(pricesOf(set))
				.where(and(eq(priceSets.farmId, farmId), eq(priceSets.id, priceSetId)));
			await tx.delete(priceSetItems).where(eq(priceSetItems.priceSetId, priceSetId));
			const items = itemsOf(set);
			if (items.length) {
				await tx.insert(priceSetItems).values(items.map((item) => ({ ...item, priceSetId })));
			}
			await insertAuditEntry(tx, {
				farmId,
				userId,
				action: 'price-set.updated',
				detail: { priceSetId, year: set.year }
			});
		});
	} catch (err) {
		// A set saved for the year meanwhile trips the unique index instead of the check above.
		if (err instanceof YearsTaken || isUniqueViolation(err)) {
			return { ok: false, takenYears: [set.year] };
		}
		throw err;
	}
	return { ok: true, priceSet: (await findPriceSetById(db, farmId, priceSetId))! };
}

/** The names of the farm's plans with a saved version whose years include the year. */
export async function listPlansNeedingYear(
	db: Db | Tx,
	farmId: string,
	year: number
): Promise<string[]> {
	const rows = await db
		.selectDistinct({ name: plans.name })
		.from(planVersions)
		.innerJoin(plans, eq(plans.id, planVersions.planId))
		.where(
			and(
				eq(plans.farmId, farmId),
				lte(planVersions.startYear, year),
				gt(sql`${planVersions.startYear} + ${planVersions.years}`, year)
			)
		)
		.orderBy(asc(plans.name));
	return rows.map((row) => row.name);
}

/**
 * Deletes a set no saved plan version needs, with its audit entry, in one transaction that locks the
 * set first; the plans that need its year (nothing deleted) when there are any.
 */
export async function deletePriceSet(
	db: Db | Tx,
	farmId: string,
	userId: string,
	set: Pick<PriceSetRow, 'id' | 'year'>
): Promise<{ deleted: true } | { deleted: false; planNames: string[] }> {
	return db.transaction(async (tx) => {
		const where = and(eq(priceSets.farmId, farmId), eq(priceSets.id, set.id));
		await tx.select({ id: priceSets.id }).from(priceSets).where(where).for('update');
		const planNames = await listPlansNeedingYear(tx, farmId, set.year);
		if (planNames.length) return { deleted: false, planNames };
		await tx.delete(priceSets).where(where);
		await insertAuditEntry(tx, {
			farmId,
			userId,
			action: 'price-set.deleted',
			detail: { priceSetId: set.id, year: set.year }
		});
		return { deleted: true };
	});
}

/** The farm's operations by name: what a custom rate may be for (`key` is the plan-file id). */
export async function listOperationsToPrice(db: Db | Tx, farmId: string) {
	return db
		.select({ key: fieldOperations.key, name: fieldOperations.name, by: fieldOperations.by })
		.from(fieldOperations)
		.where(eq(fieldOperations.farmId, farmId))
		.orderBy(asc(fieldOperations.name), asc(fieldOperations.key));
}

/** The seed ids the farm's practices sow, as crop seed or in a cover mix, in order. */
export async function listSeedIdsSown(db: Db | Tx, farmId: string): Promise<string[]> {
	const rows = await db
		.select({ detail: cropPractices.detail })
		.from(cropPractices)
		.where(eq(cropPractices.farmId, farmId));
	const ids = new Set<string>();
	for (const { detail } of rows) {
		if (detail.seed) ids.add(detail.seed.seedId);
		for (const species of detail.coverMix?.species ?? []) ids.add(species.seedId);
	}
	return [...ids].sort();
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
				where: eq(priceSetItems.kind, 'crop'),
				orderBy: asc(priceSetItems.key)
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
		// In key order, so the file's price maps list their keys alike in every export.
		with: { items: { orderBy: [asc(priceSetItems.key), asc(priceSetItems.kind)] } }
	});
	return rows.map(priceSetOf);
}

/** Adds one set and its items; its id, or undefined (nothing added) when the farm has the year. */
async function insertSetRows(tx: Tx, farmId: string, set: PriceSet): Promise<string | undefined> {
	const [row] = await tx
		.insert(priceSets)
		.values({ farmId, ...pricesOf(set) })
		.onConflictDoNothing()
		.returning({ id: priceSets.id });
	if (!row) return undefined;
	const items = itemsOf(set);
	if (items.length) {
		await tx.insert(priceSetItems).values(items.map((item) => ({ ...item, priceSetId: row.id })));
	}
	return row.id;
}

class YearsTaken extends Error {
	constructor(readonly years: number[]) {
		super(`The farm already has price sets for ${years.join(', ')}.`);
	}
}

/** PostgreSQL's unique_violation, whether Drizzle hands the driver's error over or wraps it. */
function isUniqueViolation(err: unknown): boolean {
	for (let e: unknown = err; e instanceof Error; e = e.cause) {
		if ((e as { code?: unknown }).code === '23505') return true;
	}
	return false;
}

function pricesOf(set: PriceSet) {
	return {
		year: set.year,
		nitrogenUsdPerLb: set.nitrogenUsdPerLb,
		dieselUsdPerGallon: set.dieselUsdPerGallon,
		labourUsdPerHour: set.labourUsdPerHour,
		hayUsdPerBale: set.hayUsdPerBale
	};
}

function itemsOf(set: PriceSet): PriceItem[] {
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
): PriceSet {
	const of = (kind: (typeof priceSetItems.$inferSelect)['kind']) =>
		set.items.filter((item) => item.kind === kind);
	// One pass over both seed kinds, so the seeds keep the items' key order.
	const seedPrices = new Map<string, { usdPerThousandSeeds?: number; usdPerLb?: number }>();
	for (const item of set.items) {
		const price =
			item.kind === 'seed-per-thousand-seeds'
				? { usdPerThousandSeeds: item.priceUsd }
				: item.kind === 'seed-per-lb'
					? { usdPerLb: item.priceUsd }
					: undefined;
		if (price) seedPrices.set(item.key, { ...seedPrices.get(item.key), ...price });
	}
	return {
		year: set.year,
		cropPricesUsdPerUnit: Object.fromEntries(of('crop').map((i) => [i.key, i.priceUsd])),
		nitrogenUsdPerLb: set.nitrogenUsdPerLb,
		dieselUsdPerGallon: set.dieselUsdPerGallon,
		labourUsdPerHour: set.labourUsdPerHour,
		hayUsdPerBale: set.hayUsdPerBale,
		seedPrices: Object.fromEntries(seedPrices),
		customRatesUsdPerAcre: Object.fromEntries(
			of('custom-rate-per-acre').map((i) => [i.key, i.priceUsd])
		)
	};
}
