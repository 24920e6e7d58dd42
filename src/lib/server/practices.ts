// What the practices and rotations pages and API share: the checks a body's shape cannot make (the
// plan file's own), and refusals worded once.
import { json } from '@sveltejs/kit';
import { setError, type FormPathLeavesWithErrors, type SuperValidated } from 'sveltekit-superforms';
import type { CropDefinition } from '$lib/schemas/crops';
import { toFieldIssues, type FieldIssue } from '$lib/schemas/issues';
import { practiceIssues, rotationIssues } from '$lib/schemas/plan-file';
import {
	practiceBodySchema,
	practiceFromForm,
	rotationBodySchema,
	type PracticeBody,
	type PracticeForm,
	type RotationBody,
	type RotationForm
} from '$lib/schemas/practices';
import type { PracticeRow, PracticeToSave } from '$lib/server/db/crop-practices';
import { listOperationChoices, listPractices } from '$lib/server/db/crop-practices';
import { listCropsWithBuiltIns } from '$lib/server/db/crops';
import { readAll, type Db, type Tx } from '$lib/server/db/client';

const quoted = (names: string[]) => names.map((name) => `"${name}"`).join(', ');

export function practiceKeyTakenMessage(key: string): string {
	return `Another practice of this farm has the key "${key}": choose another.`;
}

export function rotationKeyTakenMessage(key: string): string {
	return `Another rotation of this farm has the key "${key}": choose another.`;
}

export function practiceInUseMessage(name: string, rotationNames: string[]): string {
	const one = rotationNames.length === 1;
	return `${name} is a year of ${one ? 'the rotation' : 'the rotations'} ${quoted(rotationNames)}: take it out of ${one ? 'that rotation' : 'those rotations'} before deleting it.`;
}

export function rotationInUseMessage(name: string, planNames: string[]): string {
	const one = planNames.length === 1;
	return `${name} is in ${one ? 'the plan' : 'the plans'} ${quoted(planNames)}: take it out of ${one ? 'that plan' : 'those plans'} before deleting it.`;
}

/** 422 for problems found after the body's shape passed (the same answer as a schema's refusal). */
export function invalidIssues(issues: FieldIssue[]) {
	return json({ message: 'The input is not valid.', issues }, { status: 422 });
}

/** What a practice may name on this farm: its crops (built-in and own) and operations by key. */
export async function loadPracticeReferences(db: Db | Tx, farmId: string) {
	const [crops, operations] = await readAll(db, [
		() => listCropsWithBuiltIns(db, farmId),
		() => listOperationChoices(db, farmId)
	]);
	return {
		crops: new Map<string, CropDefinition>(crops.map((crop) => [crop.id, crop])),
		operationIds: new Map(operations.map((op) => [op.key, op.id]))
	};
}
export type PracticeReferences = Awaited<ReturnType<typeof loadPracticeReferences>>;

/**
 * A practice body by the plan file's own cross-checks (known crop and operations, N curve rules): the
 * practice to save, its residue grazing stating the crop's own leaf and husk when the body leaves it
 * out; or the problems, each by its path in the body.
 */
export function checkPractice(
	body: Omit<PracticeBody, 'key'>,
	refs: PracticeReferences
): { ok: true; practice: Omit<PracticeToSave, 'key'> } | { ok: false; issues: FieldIssue[] } {
	const issues = practiceIssues(body, refs.crops, new Set(refs.operationIds.keys()));
	if (issues.length) {
		return {
			ok: false,
			issues: issues.map(({ path, message }) => ({ path: path.join('.'), message }))
		};
	}
	const residue = body.residueGrazing;
	const ownFigure = refs.crops.get(body.crop)?.residueLeafHuskLbDmPerUnit ?? 0;
	return {
		ok: true,
		practice: {
			...body,
			residueGrazing: residue && {
				utilisationPercent: residue.utilisationPercent,
				leafHuskLbDmPerUnit: residue.leafHuskLbDmPerUnit ?? ownFigure
			}
		}
	};
}

/** A rotation body's practice keys as row ids, or the unknown keys by their path. */
export function checkRotation(
	body: RotationBody,
	practiceIds: ReadonlyMap<string, string>
): { ok: true; practiceIds: string[] } | { ok: false; issues: FieldIssue[] } {
	const issues = rotationIssues(body, new Set(practiceIds.keys()));
	if (issues.length) {
		return {
			ok: false,
			issues: issues.map(({ path, message }) => ({ path: path.join('.'), message }))
		};
	}
	return { ok: true, practiceIds: body.practices.map((key) => practiceIds.get(key)!) };
}

/**
 * The practice form's values as a practice to save (less its key), by the practice body's schema and the
 * plan file's cross-checks; undefined after putting their messages on the form beside their inputs.
 */
export function practiceFromFormOrErrors(
	form: SuperValidated<PracticeForm>,
	refs: PracticeReferences
): Omit<PracticeToSave, 'key'> | undefined {
	const { body, formPath } = practiceFromForm(form.data);
	const parsed = practiceBodySchema.safeParse(body);
	const issues = parsed.success
		? (() => {
				const checked = checkPractice(parsed.data, refs);
				return checked.ok ? checked.practice : checked.issues;
			})()
		: toFieldIssues(parsed.error);
	if (!Array.isArray(issues)) return issues;
	for (const { path, message } of issues) {
		setError(form, formPath(path) as FormPathLeavesWithErrors<PracticeForm>, message);
	}
	return undefined;
}

/**
 * The rotation form's years as practice row ids (empty years left out), by the rotation body's schema
 * and the farm's practices; undefined after putting the messages beside their inputs.
 */
export function rotationFromFormOrErrors(
	form: SuperValidated<RotationForm>,
	practiceIds: ReadonlyMap<string, string>
): string[] | undefined {
	const years = form.data.practice.flatMap((key, i) => (key ? [i] : []));
	const body = { name: form.data.name, practices: years.map((i) => form.data.practice[i]) };
	const parsed = rotationBodySchema.safeParse(body);
	const checked = parsed.success ? checkRotation(parsed.data, practiceIds) : undefined;
	if (checked?.ok) return checked.practiceIds;
	const issues = checked ? checked.issues : toFieldIssues(parsed.error!);
	for (const { path, message } of issues) {
		const [head, index] = path.split('.');
		const at =
			head !== 'practices'
				? head
				: index === undefined
					? 'practice._errors'
					: `practice[${years[Number(index)]}]`;
		setError(form, at as FormPathLeavesWithErrors<RotationForm>, message);
	}
	return undefined;
}

/** What the practice form offers: the farm's crops and its catalogue of field operations. */
export async function loadPracticeFormChoices(db: Db | Tx, farmId: string) {
	const [crops, operations] = await readAll(db, [
		() => listCropsWithBuiltIns(db, farmId),
		() => listOperationChoices(db, farmId)
	]);
	return {
		crops: crops.map(({ id, name, soldBy, legume }) => ({ id, name, soldBy, legume })),
		operations: operations.map(({ key, name, month }) => ({ key, name, month }))
	};
}

/** The practices a rotation's years may be, by name, with their crop's name for the choice's label. */
/** One year of a rotation as the rotation strip and the plan grid show it. */
export interface RotationYear {
	practiceKey: string;
	practiceName: string;
	cropId: string;
	cropName: string;
	cover: boolean;
	coverGrazed: boolean;
	residueGrazed: boolean;
}

/** A practice's crop name and the marks its cell carries (a cover, grazed cover, grazed residue). */
export function rotationYear(
	practice: Pick<PracticeRow, 'key' | 'name' | 'crop' | 'coverMix' | 'residueGrazing'>,
	cropById: Map<string, CropDefinition>
): RotationYear {
	return {
		practiceKey: practice.key,
		practiceName: practice.name,
		cropId: practice.crop,
		cropName: cropById.get(practice.crop)?.name ?? practice.crop,
		cover: practice.coverMix !== null,
		coverGrazed: (practice.coverMix?.grazingUtilisationPercent ?? 0) > 0,
		residueGrazed: (practice.residueGrazing?.utilisationPercent ?? 0) > 0
	};
}

export async function loadRotationChoices(db: Db | Tx, farmId: string) {
	const [practices, crops] = await readAll(db, [
		() => listPractices(db, farmId),
		() => listCropsWithBuiltIns(db, farmId)
	]);
	const cropById = new Map(crops.map((crop) => [crop.id, crop]));
	return {
		practices,
		cropById,
		choices: practices.map((practice) => ({
			key: practice.key,
			name: practice.name,
			cropName: cropById.get(practice.crop)?.name ?? practice.crop
		}))
	};
}
