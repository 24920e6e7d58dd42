// What the price-set pages and API share: refusals worded once, and the farm's own ids a set may price.
import { json } from '@sveltejs/kit';
import { toFieldIssues, type FieldIssue } from '$lib/schemas/issues';
import { priceSetBodySchema, type PriceSet } from '$lib/schemas/price-sets';
import { readAll, type Db, type Tx } from './db/client';
import { listCropsWithBuiltIns } from './db/crops';
import { createPriceSets, listOperationsToPrice, type PriceSetRow } from './db/price-sets';

const quoted = (names: readonly string[]) => names.map((name) => `"${name}"`).join(', ');

export function yearTakenMessage(year: number): string {
	return `The farm already has prices for ${year}: change that year's set instead.`;
}

export function nextYearTakenMessage(year: number): string {
	return `The farm already has prices for ${year}: change that set, or delete it before copying.`;
}

export function unknownCropMessage(cropId: string): string {
	return `The farm has no crop "${cropId}": add it on the crops page first, or leave its price out.`;
}

export function unknownOperationMessage(operationId: string): string {
	return `The farm has no field operation "${operationId}": add it first, or leave its rate out.`;
}

export function priceSetInUseMessage(year: number, planNames: readonly string[]): string {
	const one = planNames.length === 1;
	return `The ${year} prices are used by ${one ? 'the plan' : 'the plans'} ${quoted(planNames)}, whose years include ${year}: change ${one ? 'that plan' : 'those plans'} before deleting them.`;
}

/** The crop and operation ids a set may price: the built-in crops, the farm's own, its operations. */
export async function findPriceableIds(db: Db | Tx, farmId: string) {
	const [crops, operations] = await readAll(db, [
		() => listCropsWithBuiltIns(db, farmId),
		() => listOperationsToPrice(db, farmId)
	]);
	return {
		cropIds: new Set(crops.map((crop) => crop.id)),
		operationIds: new Set(operations.map((operation) => operation.key))
	};
}
export type PriceableIds = Awaited<ReturnType<typeof findPriceableIds>>;

/** Prices for crops or operations the farm does not have, each named by its path in the set. */
export function unknownIdIssues(set: PriceSet, known: PriceableIds): FieldIssue[] {
	return [
		...Object.keys(set.cropPricesUsdPerUnit)
			.filter((cropId) => !known.cropIds.has(cropId))
			.map((cropId) => ({
				path: `cropPricesUsdPerUnit.${cropId}`,
				message: unknownCropMessage(cropId)
			})),
		...Object.keys(set.customRatesUsdPerAcre)
			.filter((operationId) => !known.operationIds.has(operationId))
			.map((operationId) => ({
				path: `customRatesUsdPerAcre.${operationId}`,
				message: unknownOperationMessage(operationId)
			}))
	];
}

/** The API's 422 for problems only the farm's data shows (a crop it does not grow). */
export function invalidIssues(issues: FieldIssue[]) {
	return json({ message: 'The input is not valid.', issues }, { status: 422 });
}

/** The API's 409 for a year that already has a set, named on `year` as a form would show it. */
export function yearTaken(message: string) {
	return json({ message, issues: [{ path: 'year', message }] }, { status: 409 });
}

/** A refusal of a write, as the API answers it and the pages show it. */
export interface Refusal {
	status: 409 | 422;
	message: string;
	issues: FieldIssue[];
}

export function refusalResponse({ status, message, issues }: Refusal) {
	return json({ message, issues }, { status });
}

/**
 * Copies a set to the year after it, checked as a new set (the year in range, every crop and operation
 * still the farm's); a refusal when the next year has a set or the copy would not be valid.
 */
export async function copyToNextYear(
	db: Db | Tx,
	farmId: string,
	userId: string,
	set: PriceSetRow
): Promise<{ ok: true; priceSet: PriceSetRow } | ({ ok: false } & Refusal)> {
	const { id: _, ...values } = set;
	const next = priceSetBodySchema.safeParse({ ...values, year: set.year + 1 });
	const issues = next.success
		? unknownIdIssues(next.data, await findPriceableIds(db, farmId))
		: toFieldIssues(next.error);
	if (!next.success || issues.length) {
		return { ok: false, status: 422, message: issues.map((i) => i.message).join(' '), issues };
	}
	const saved = await createPriceSets(db, farmId, userId, [next.data]);
	if (saved.ok) return { ok: true, priceSet: saved.priceSets[0] };
	const message = nextYearTakenMessage(next.data.year);
	return { ok: false, status: 409, message, issues: [{ path: 'year', message }] };
}
