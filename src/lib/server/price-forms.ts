// The price form's parts, shared by the prices list (add a year) and a set's own page (change it).
import { setError, type SuperValidated } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import type { CropDefinition } from '$lib/schemas/crops';
import { toFieldIssues } from '$lib/schemas/issues';
import {
	priceSetBodySchema,
	priceSetFormSchema,
	priceSetOfForm,
	type PriceSet,
	type PriceSetForm,
	type PriceSetFormLayout
} from '$lib/schemas/price-sets';
import { readAll, type Db, type Tx } from './db/client';
import { listCropsWithBuiltIns } from './db/crops';
import { listOperationsToPrice, listSeedIdsSown } from './db/price-sets';
import { unknownIdIssues } from './prices';

// Room to add seeds a practice does not sow yet; a plain form cannot add inputs of its own.
const blankSeedRows = 2;

/** What the form shows for a farm: its crops with their sale units, its custom-hired operations. */
export interface PriceFormParts {
	/** With each crop's weight, for showing its price per tonne. */
	crops: CropDefinition[];
	operations: { id: string; name: string }[];
	seedIds: string[];
	layout: PriceSetFormLayout;
}

/**
 * The farm's crops and the operations it hires out (and any other that `stored` has a rate for); seed
 * rows for the seeds its practices sow and `stored` prices, and blank ones, unless `seedRows` says how
 * many a posted form holds.
 */
export async function findPriceFormParts(
	db: Db | Tx,
	farmId: string,
	stored: PriceSet | null,
	seedRows?: number
): Promise<PriceFormParts> {
	const [crops, operations, sown] = await readAll(db, [
		() => listCropsWithBuiltIns(db, farmId),
		() => listOperationsToPrice(db, farmId),
		() => listSeedIdsSown(db, farmId)
	]);
	const rated = new Set(Object.keys(stored?.customRatesUsdPerAcre ?? {}));
	const priced = operations.filter((op) => op.by === 'custom' || rated.has(op.key));
	const seedIds = [...new Set([...Object.keys(stored?.seedPrices ?? {}), ...sown])].sort();
	const parts = {
		crops: crops.map(({ builtIn: _, ...crop }) => crop),
		operations: priced.map((op) => ({ id: op.key, name: op.name })),
		seedIds
	};
	return {
		...parts,
		layout: {
			cropIds: parts.crops.map((crop) => crop.id),
			operationIds: parts.operations.map((op) => op.id),
			seedRows: seedRows ?? seedIds.length + blankSeedRows
		}
	};
}

export function priceFormAdapter(layout: PriceSetFormLayout) {
	return zod4(priceSetFormSchema(layout));
}

/**
 * The valid form's values as a set, by the API's own checks; undefined after putting their messages
 * on the form beside the inputs they came from.
 */
export function priceSetFromForm(
	form: SuperValidated<PriceSetForm>,
	parts: PriceFormParts
): PriceSet | undefined {
	const { body, inputOf } = priceSetOfForm(form.data, parts.layout);
	const parsed = priceSetBodySchema.safeParse(body);
	const issues = parsed.success
		? unknownIdIssues(parsed.data, {
				cropIds: new Set(parts.layout.cropIds),
				operationIds: new Set(parts.layout.operationIds)
			})
		: toFieldIssues(parsed.error);
	for (const { path, message } of issues) setError(form, inputOf(path), message);
	return parsed.success && !issues.length ? parsed.data : undefined;
}

/** What the form component needs of the parts (no more than the page shows). */
export function formPartsForPage({ crops, operations, seedIds, layout }: PriceFormParts) {
	return {
		crops: crops.map(({ id, name, soldBy }) => ({ id, name, soldBy })),
		operations,
		seedIds,
		layout
	};
}
