// /api/v1/farms/[farmId]/plans: drafts checked as the plan file they make on the farm, versions saved
// against the version they were edited from (of two racing saves exactly one wins), restore, copy,
// the reference plan, delete, the guards, results as a summary or in full with a partial budget, and
// plan files out and back in. Refusals leave the farm as it was.
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import type {
	FarmYearSummary,
	PlanResult,
	PlanSummary as EnginePlanSummary
} from '../../src/lib/engine';
import {
	parsePlanDocument,
	type PlanDocument,
	type PlanDocumentInput
} from '../../src/lib/schemas/plan-file';

type PlanAdjustmentInput = NonNullable<PlanDocumentInput['plan']['adjustments']>[number];
import { planVersions } from '../../src/lib/server/db/schema';
import { testDb } from '../support/db';
import { addMember } from '../support/farms';
import { registerUser, type Client } from '../support/http';
import { farmSnapshot, importReferencePlan, ownFarm, reviewerOf } from './farm-setup-support';

const db = testDb();

interface FieldRotation {
	fieldId: string;
	rotationId: string;
	startingPhase: number;
}
interface Draft {
	plan: {
		name: string;
		horizon: { startYear: number; years: number };
		fieldRotations: FieldRotation[];
		assumptions: string[];
		adjustments?: PlanAdjustmentInput[];
	};
	herd: unknown;
	notes: string;
}
interface StoredPlan extends Draft {
	id: string;
	name: string;
	isReference: boolean;
	version: number;
}
interface ListedPlan {
	id: string;
	name: string;
	isReference: boolean;
	currentVersion: number;
	startYear: number;
	years: number;
}
interface ListedVersion {
	version: number;
	savedAt: string;
	savedBy: string;
	changeNote: string;
	restoredFromVersion: number | null;
}
type Issue = { path: string; message: string };
// The engine's type leaves `farmYears` as the full result's; the summary's farm-years carry more.
type PlanSummary = Omit<EnginePlanSummary, 'farmYears'> & { farmYears: FarmYearSummary[] };

// The rotation scenarios/wide-row-interseeded.json adds to the farm, beside the reference's corn–soybean.
const wideRows = 'wide-corn-soybean';
const scenario = (name: string) => JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));

let owner: Client;
let editor: Client;
let reviewer: Client;
let farmId: string;
let otherOwner: Client;
let otherFarmId: string;
let otherPlanId: string;
let referenceDoc: PlanDocument;
let referencePlanId: string;
let wideRowPlanId: string;

const plansUrl = (farm = farmId) => `/api/v1/farms/${farm}/plans`;
const planUrl = (planId: string, rest = '', farm = farmId) => `${plansUrl(farm)}/${planId}${rest}`;

async function body<T>(response: Response, status: number): Promise<T> {
	expect(response.status, await response.clone().text()).toBe(status);
	return (await response.json()) as T;
}

async function listPlans(client = owner, farm = farmId) {
	return (await body<{ plans: ListedPlan[] }>(await client.fetch(plansUrl(farm)), 200)).plans;
}

async function getPlan(planId: string, client = owner) {
	return (await body<{ plan: StoredPlan }>(await client.fetch(planUrl(planId)), 200)).plan;
}

async function listVersions(planId: string, client = owner) {
	const response = await client.fetch(planUrl(planId, '/versions'));
	return (await body<{ versions: ListedVersion[] }>(response, 200)).versions;
}

function draftOf({ plan, herd, notes }: StoredPlan): Draft {
	return structuredClone({ plan, herd, notes });
}

/** The draft with one field on another rotation (phase 1). */
function withRotation(draft: Draft, fieldId: string, rotationId: string): Draft {
	const changed = structuredClone(draft);
	const assignment = changed.plan.fieldRotations.find((a) => a.fieldId === fieldId)!;
	assignment.rotationId = rotationId;
	assignment.startingPhase = 1;
	return changed;
}

async function createPlan(draft: Draft, changeNote = '', client = owner) {
	const response = await client.json(plansUrl(), 'POST', { ...draft, changeNote });
	return (await body<{ plan: { id: string; name: string; version: number } }>(response, 201)).plan;
}

/** A new plan holding the reference plan's content under another name. */
async function referenceCopy(name: string) {
	const draft = draftOf(await getPlan(referencePlanId));
	draft.plan.name = name;
	return { ...(await createPlan(draft)), draft };
}

async function results<T = PlanSummary>(planId: string, query = '', client = owner) {
	return body<T>(await client.fetch(planUrl(planId, `/results${query}`)), 200);
}

const paths = (issues: Issue[]) => issues.map((issue) => issue.path);
const sum = (values: number[]) => values.reduce((total, value) => total + value, 0);

beforeAll(async () => {
	[{ owner, farmId }, { owner: otherOwner, farmId: otherFarmId }] = await Promise.all([
		ownFarm('plans'),
		ownFarm('plans-other')
	]);
	[referenceDoc] = await Promise.all([
		importReferencePlan(db, farmId),
		importReferencePlan(db, otherFarmId)
	]);
	const editorAccount = await registerUser('plans-editor');
	editor = editorAccount.client;
	await addMember(db, farmId, editorAccount.email, 'editor');
	reviewer = await reviewerOf(db, farmId, 'plans-reviewer');
	const imported = await owner.json(
		`${plansUrl()}/import`,
		'POST',
		scenario('wide-row-interseeded')
	);
	wideRowPlanId = (await body<{ plan: { id: string } }>(imported, 201)).plan.id;
	referencePlanId = (await listPlans()).find((p) => p.isReference)!.id;
	otherPlanId = (await listPlans(otherOwner, otherFarmId))[0].id;
});

describe('the plan list and new plans', () => {
	it("lists the farm's plans by name with the current version's horizon, to every member", async () => {
		const listed = await listPlans();
		expect(listed).toEqual(
			expect.arrayContaining([
				{
					id: referencePlanId,
					name: referenceDoc.plan.name,
					isReference: true,
					currentVersion: 1,
					startYear: 2027,
					years: 5
				},
				expect.objectContaining({ id: wideRowPlanId, isReference: false, currentVersion: 1 })
			])
		);
		const names = listed.map((p) => p.name);
		expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));
		expect((await listPlans(reviewer)).map((p) => p.id)).toEqual(listed.map((p) => p.id));
		expect(listed.map((p) => p.id)).not.toContain(otherPlanId);
	});

	it('adds a plan from a draft as version 1, with its note', async () => {
		const draft = withRotation(draftOf(await getPlan(referencePlanId)), 'north-flat', wideRows);
		draft.plan.name = 'Wide rows on the north flat';
		draft.notes = 'Try the interseeded mix on one field first.';
		const created = await createPlan(draft, 'First try');
		expect(created).toEqual({
			id: expect.stringMatching(/^[0-9a-f-]{36}$/),
			name: 'Wide rows on the north flat',
			version: 1
		});
		const stored = await getPlan(created.id);
		expect(stored).toEqual({
			id: created.id,
			isReference: false,
			version: 1,
			...draft,
			name: draft.plan.name
		});
		const [first] = await listVersions(created.id);
		expect(first).toMatchObject({ version: 1, changeNote: 'First try', savedBy: 'Test plans' });
	});

	it('refuses a draft naming an unknown rotation and a year without prices, changing nothing', async () => {
		const before = await farmSnapshot(db, farmId);
		const plansBefore = await listPlans();
		const draft = draftOf(await getPlan(referencePlanId));
		draft.plan.name = 'Never saved';
		draft.plan.fieldRotations[0].rotationId = 'no-such-rotation';
		// The farm has prices for 2027–2031 (scenarios/reference.json): 2032 has none.
		draft.plan.horizon = { startYear: 2028, years: 5 };
		const response = await owner.json(plansUrl(), 'POST', draft);
		const { issues } = await body<{ issues: Issue[] }>(response, 422);
		expect(paths(issues)).toContain('plan.fieldRotations.0.rotationId');
		expect(issues).toContainEqual({
			path: 'priceSets',
			message: expect.stringContaining('2032')
		});
		// A field given twice is named where the draft gives it the second time, and nowhere else.
		const twice = draftOf(await getPlan(referencePlanId));
		twice.plan.fieldRotations[1].fieldId = twice.plan.fieldRotations[0].fieldId;
		const repeated = await owner.json(plansUrl(), 'POST', twice);
		expect(paths((await body<{ issues: Issue[] }>(repeated, 422)).issues)).toEqual([
			'plan.fieldRotations.1.fieldId'
		]);
		const outOfRange = draftOf(await getPlan(referencePlanId));
		outOfRange.plan.horizon.years = 0;
		const shape = await owner.json(plansUrl(), 'POST', outOfRange);
		expect(paths((await body<{ issues: Issue[] }>(shape, 422)).issues)).toEqual([
			'plan.horizon.years'
		]);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		expect(await listPlans()).toEqual(plansBefore);
	});
});

describe('versions', () => {
	it("answers the newest version as the plan file's plan, herd and notes", async () => {
		const stored = await getPlan(referencePlanId);
		const byField = (a: FieldRotation, b: FieldRotation) => a.fieldId.localeCompare(b.fieldId);
		expect(stored).toEqual({
			id: referencePlanId,
			name: referenceDoc.plan.name,
			isReference: true,
			version: 1,
			plan: {
				...referenceDoc.plan,
				fieldRotations: [...referenceDoc.plan.fieldRotations].sort(byField)
			},
			herd: referenceDoc.herd,
			notes: referenceDoc.notes
		});
	});

	it('saves version 2 from version 1, with who saved each version and their note, newest first', async () => {
		const { id, draft } = await referenceCopy('Saved twice');
		const edited = withRotation(draft, 'creek-bottom', wideRows);
		const saved = await editor.json(planUrl(id), 'PUT', {
			...edited,
			baseVersion: 1,
			changeNote: 'Wide rows on the creek bottom'
		});
		expect(await body(saved, 200)).toEqual({ plan: { id, name: 'Saved twice', version: 2 } });
		expect(await getPlan(id)).toMatchObject({ version: 2, ...edited });
		const versions = await listVersions(id);
		expect(versions.map((v) => v.version)).toEqual([2, 1]);
		expect(versions[0]).toMatchObject({
			savedBy: 'Test plans-editor',
			changeNote: 'Wide rows on the creek bottom',
			restoredFromVersion: null
		});
		expect(versions[1]).toMatchObject({ savedBy: 'Test plans', changeNote: '' });
		expect(Date.parse(versions[0].savedAt)).toBeGreaterThanOrEqual(Date.parse(versions[1].savedAt));
		// Results of version 1 are still those of the content it was saved with.
		const first = await results(id, '?version=1');
		expect(first.fields.find((f) => f.fieldId === 'creek-bottom')!.rotationId).toBe('corn-soybean');
	});

	it('keeps a version’s N and yield changes, and its results follow them', async () => {
		const { id, draft } = await referenceCopy('Thirty pounds less N');
		const edited = structuredClone(draft);
		edited.plan.adjustments = [{ nitrogenChangeLbPerAcre: -30, yieldChangePercent: 0 }];
		await body(await owner.json(planUrl(id), 'PUT', { ...edited, baseVersion: 1 }), 200);
		expect((await getPlan(id)).plan.adjustments).toEqual(edited.plan.adjustments);
		const [before, after] = [await results(id, '?version=1'), await results(id)];
		// Every field-year applying N applies 30 lb/ac less (none below zero), so the farm buys less.
		after.farmYears.forEach((year, i) => {
			expect(year.nitrogen.appliedLb).toBeLessThan(before.farmYears[i].nitrogen.appliedLb);
		});
		const refused = await owner.json(planUrl(id), 'PUT', {
			...edited,
			plan: { ...edited.plan, adjustments: [{ practiceId: 'no-such-practice' }] },
			baseVersion: 2
		});
		expect(paths((await body<{ issues: Issue[] }>(refused, 422)).issues)).toEqual([
			'plan.adjustments.0.practiceId'
		]);
		expect((await listVersions(id)).length).toBe(2);
	});

	it('keeps a field’s N change on that field when its key is renamed', async () => {
		const { id, draft } = await referenceCopy('Less N on one field');
		const edited = structuredClone(draft);
		const fieldKey = edited.plan.fieldRotations[0].fieldId;
		edited.plan.adjustments = [
			{ fieldId: fieldKey, nitrogenChangeLbPerAcre: -25, yieldChangePercent: 0 }
		];
		await body(await owner.json(planUrl(id), 'PUT', { ...edited, baseVersion: 1 }), 200);
		const { fields } = await body<{ fields: { id: string; key: string }[] }>(
			await owner.fetch(`/api/v1/farms/${farmId}/fields`),
			200
		);
		const field = fields.find((f) => f.key === fieldKey)!;
		const renamed = `${fieldKey}-renamed`;
		await body(
			await owner.json(`/api/v1/farms/${farmId}/fields/${field.id}`, 'PATCH', { key: renamed }),
			200
		);
		expect((await getPlan(id)).plan.adjustments).toEqual([
			{ fieldId: renamed, nitrogenChangeLbPerAcre: -25, yieldChangePercent: 0 }
		]);
		// The results still evaluate, with the change on the renamed field only.
		const summary = await results(id);
		expect(summary.fields.map((f) => f.fieldId)).toContain(renamed);
	});

	it('of two saves racing from the same version, saves one and refuses the other with the newest version', async () => {
		const { id, draft } = await referenceCopy('Raced');
		const ownersEdit = withRotation(draft, 'north-flat', wideRows);
		const editorsEdit = structuredClone(draft);
		editorsEdit.notes = 'The editor’s notes, lost if this save overwrote the other.';
		const [fromOwner, fromEditor] = await Promise.all([
			owner.json(planUrl(id), 'PUT', { ...ownersEdit, baseVersion: 1, changeNote: 'owner' }),
			editor.json(planUrl(id), 'PUT', { ...editorsEdit, baseVersion: 1, changeNote: 'editor' })
		]);
		expect([fromOwner.status, fromEditor.status].sort()).toEqual([200, 409]);
		const [winner, loser] =
			fromOwner.status === 200 ? [ownersEdit, fromEditor] : [editorsEdit, fromOwner];
		expect(await loser.json()).toMatchObject({
			currentVersion: 2,
			message: expect.stringContaining('nothing of yours was saved')
		});
		expect(await getPlan(id)).toMatchObject({ version: 2, ...winner });
		const versions = await listVersions(id);
		expect(versions.map((v) => v.version)).toEqual([2, 1]);
		expect(versions[0].changeNote).toBe(winner === ownersEdit ? 'owner' : 'editor');
		const rows = await db.select().from(planVersions).where(eq(planVersions.planId, id));
		expect(rows).toHaveLength(2);
		// The one refused saves again from the version it was told of, and nothing is lost.
		const loserEdit = winner === ownersEdit ? editorsEdit : ownersEdit;
		const retried = await owner.json(planUrl(id), 'PUT', {
			...loserEdit,
			baseVersion: 2,
			changeNote: 'again'
		});
		expect((await body<{ plan: { version: number } }>(retried, 200)).plan.version).toBe(3);
	});

	it('restores an older version as a new one with the same content, against the newest version', async () => {
		const { id, draft } = await referenceCopy('Restored');
		const edited = withRotation(draft, 'north-flat', wideRows);
		edited.notes = 'Changed, then changed back.';
		await body(await owner.json(planUrl(id), 'PUT', { ...edited, baseVersion: 1 }), 200);
		const restore = await owner.json(planUrl(id, '/versions'), 'POST', {
			version: 1,
			baseVersion: 2
		});
		expect(await body(restore, 201)).toEqual({ plan: { id, name: 'Restored', version: 3 } });
		expect(await getPlan(id)).toEqual({
			id,
			name: 'Restored',
			isReference: false,
			version: 3,
			...draft
		});
		const [newest] = await listVersions(id);
		expect(newest).toMatchObject({ version: 3, restoredFromVersion: 1, savedBy: 'Test plans' });
		const [v1, v3] = await Promise.all([results(id, '?version=1'), results(id, '?version=3')]);
		expect(v3.farmYears).toEqual(v1.farmYears);

		const stale = await owner.json(planUrl(id, '/versions'), 'POST', {
			version: 2,
			baseVersion: 2
		});
		expect(await body(stale, 409)).toMatchObject({ currentVersion: 3 });
		const missing = await owner.json(planUrl(id, '/versions'), 'POST', {
			version: 9,
			baseVersion: 3
		});
		expect(missing.status).toBe(404);
		expect((await listVersions(id)).map((v) => v.version)).toEqual([3, 2, 1]);
	});
});

describe('copies, the reference plan and deleting', () => {
	it("copies a plan's newest version as a new plan under another name", async () => {
		const { id, draft } = await referenceCopy('Copied from');
		const edited = withRotation(draft, 'east-ridge', wideRows);
		await body(await owner.json(planUrl(id), 'PUT', { ...edited, baseVersion: 1 }), 200);
		const response = await editor.json(planUrl(id, '/copy'), 'POST', { name: 'The copy' });
		const { plan: copy } = await body<{ plan: { id: string; version: number } }>(response, 201);
		expect(copy).toMatchObject({ name: 'The copy', version: 1 });
		expect(copy.id).not.toBe(id);
		const stored = await getPlan(copy.id);
		expect(stored).toEqual({
			id: copy.id,
			name: 'The copy',
			isReference: false,
			version: 1,
			...edited,
			plan: { ...edited.plan, name: 'The copy' }
		});
		const [version] = await listVersions(copy.id);
		expect(version).toMatchObject({
			savedBy: 'Test plans-editor',
			changeNote: expect.stringContaining('Copied from')
		});
		expect((await getPlan(id)).version).toBe(2);
		const unnamed = await owner.json(planUrl(id, '/copy'), 'POST', { name: '' });
		expect(paths((await body<{ issues: Issue[] }>(unnamed, 422)).issues)).toEqual(['name']);
	});

	it('makes another plan the reference, leaving one reference plan on the farm', async () => {
		const { id } = await referenceCopy('Reference for a while');
		const made = await editor.fetch(planUrl(id, '/reference'), { method: 'POST' });
		expect(await body(made, 200)).toMatchObject({ plan: { id, isReference: true } });
		let references = (await listPlans()).filter((p) => p.isReference);
		expect(references.map((p) => p.id)).toEqual([id]);
		expect((await getPlan(referencePlanId)).isReference).toBe(false);
		// Results compare against the plan asked for, the new reference included.
		const budget = await results(referencePlanId, `?against=${id}`);
		expect(budget.partialBudget!.referencePlanName).toBe('Reference for a while');

		await body(await owner.fetch(planUrl(referencePlanId, '/reference'), { method: 'POST' }), 200);
		references = (await listPlans()).filter((p) => p.isReference);
		expect(references.map((p) => p.id)).toEqual([referencePlanId]);
	});

	it('keeps one reference plan when two plans are made the reference at once', async () => {
		const [first, second] = await Promise.all([
			referenceCopy('Racing for reference A'),
			referenceCopy('Racing for reference B')
		]);
		for (let round = 0; round < 3; round++) {
			const answers = await Promise.all([
				owner.fetch(planUrl(first.id, '/reference'), { method: 'POST' }),
				editor.fetch(planUrl(second.id, '/reference'), { method: 'POST' })
			]);
			expect(answers.map((a) => a.status)).toEqual([200, 200]);
			const references = (await listPlans()).filter((p) => p.isReference);
			expect(references).toHaveLength(1);
			expect([first.id, second.id]).toContain(references[0].id);
		}
		await body(await owner.fetch(planUrl(referencePlanId, '/reference'), { method: 'POST' }), 200);
	});

	it('deletes a plan with its versions for the owner only, and never the reference plan', async () => {
		const { id } = await referenceCopy('Deleted');
		for (const client of [editor, reviewer]) {
			expect((await client.fetch(planUrl(id), { method: 'DELETE' })).status).toBe(403);
		}
		expect((await getPlan(id)).version).toBe(1);
		expect((await owner.fetch(planUrl(id), { method: 'DELETE' })).status).toBe(204);
		expect((await owner.fetch(planUrl(id))).status).toBe(404);
		expect(await db.select().from(planVersions).where(eq(planVersions.planId, id))).toEqual([]);
		expect((await listPlans()).map((p) => p.id)).not.toContain(id);

		const before = await farmSnapshot(db, farmId);
		const refused = await owner.fetch(planUrl(referencePlanId), { method: 'DELETE' });
		expect(await body(refused, 409)).toMatchObject({
			message: expect.stringContaining('reference plan')
		});
		expect((await getPlan(referencePlanId)).isReference).toBe(true);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
	});
});

describe('who may do what', () => {
	it('lets a reviewer read a plan, its versions, its file and its results, and change nothing', async () => {
		const stored = await getPlan(referencePlanId, reviewer);
		expect(stored.id).toBe(referencePlanId);
		expect(await listVersions(referencePlanId, reviewer)).toHaveLength(1);
		expect((await reviewer.fetch(planUrl(referencePlanId, '/file'))).status).toBe(200);
		expect((await results(referencePlanId, '', reviewer)).detail).toBe('summary');
		const draft = withRotation(draftOf(stored), 'north-flat', wideRows);
		const live = await reviewer.json(planUrl(referencePlanId, '/results'), 'POST', draft);
		expect(live.status).toBe(200);

		const before = await farmSnapshot(db, farmId);
		const plansBefore = await listPlans();
		const refusals = await Promise.all([
			reviewer.json(plansUrl(), 'POST', { ...draft, plan: { ...draft.plan, name: 'No' } }),
			reviewer.json(`${plansUrl()}/import`, 'POST', scenario('reduced-n')),
			reviewer.json(planUrl(referencePlanId), 'PUT', { ...draft, baseVersion: 1 }),
			reviewer.json(planUrl(referencePlanId, '/versions'), 'POST', { version: 1, baseVersion: 1 }),
			reviewer.json(planUrl(referencePlanId, '/copy'), 'POST', { name: 'No' }),
			reviewer.fetch(planUrl(wideRowPlanId, '/reference'), { method: 'POST' }),
			reviewer.fetch(planUrl(wideRowPlanId), { method: 'DELETE' })
		]);
		expect(refusals.map((r) => r.status)).toEqual(Array(refusals.length).fill(403));
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		expect(await listPlans()).toEqual(plansBefore);
	});

	it("answers 404 for another farm's plan and for an id that is not a UUID, on every route", async () => {
		const draft = draftOf(await getPlan(referencePlanId));
		for (const planId of [otherPlanId, 'not-a-uuid', crypto.randomUUID()]) {
			const answers = await Promise.all([
				owner.fetch(planUrl(planId)),
				owner.json(planUrl(planId), 'PUT', { ...draft, baseVersion: 1 }),
				owner.fetch(planUrl(planId), { method: 'DELETE' }),
				owner.fetch(planUrl(planId, '/versions')),
				owner.json(planUrl(planId, '/versions'), 'POST', { version: 1, baseVersion: 1 }),
				owner.json(planUrl(planId, '/copy'), 'POST', { name: 'Stolen' }),
				owner.fetch(planUrl(planId, '/reference'), { method: 'POST' }),
				owner.fetch(planUrl(planId, '/file')),
				owner.fetch(planUrl(planId, '/results')),
				owner.json(planUrl(planId, '/results'), 'POST', draft)
			]);
			expect(
				answers.map((a) => a.status),
				planId
			).toEqual(Array(answers.length).fill(404));
		}
		// Comparing with another farm's plan, too.
		const against = await owner.fetch(planUrl(referencePlanId, `/results?against=${otherPlanId}`));
		expect(against.status).toBe(404);
		// And the other farm's owner learns nothing of this farm.
		expect((await otherOwner.fetch(planUrl(referencePlanId))).status).toBe(404);
		expect((await listPlans(otherOwner, otherFarmId)).map((p) => p.id)).toEqual([otherPlanId]);
	});
});

describe('results', () => {
	it('answers a summary by default and every field-year with detail=full, from the same numbers', async () => {
		const [summary, full] = await Promise.all([
			results(referencePlanId),
			results<PlanResult>(referencePlanId, '?detail=full')
		]);
		expect(summary.detail).toBe('summary');
		expect(summary).not.toHaveProperty('fieldYears');
		expect(summary.fields).toHaveLength(referenceDoc.fields.length);
		expect(full.fieldYears).toHaveLength(referenceDoc.fields.length * 5);
		expect(full).not.toHaveProperty('fields');
		for (const field of summary.fields) {
			const own = full.fieldYears.filter((fy) => fy.fieldId === field.fieldId);
			expect(field.netReturnUsdByYear).toEqual(own.map((fy) => fy.netReturnUsd));
			expect(field.practiceIdByYear).toEqual(own.map((fy) => fy.practiceId));
		}
		// The summary's farm-years are the full answer's, with their costs grouped and the N ledger.
		summary.farmYears.forEach((farmYear, i) => {
			expect(farmYear).toMatchObject(full.farmYears[i]);
			expect(sum(Object.values(farmYear.costGroupsUsd))).toBeCloseTo(farmYear.costsUsd, 6);
			expect(farmYear.nitrogen.purchasedLb).toBe(farmYear.nitrogenPurchasedLb);
			// What was bought is what was applied: the ledger's applied N, summed over the fields' acres.
			expect(farmYear.nitrogen.appliedLb).toBeCloseTo(farmYear.nitrogenPurchasedLb, 6);
		});
		expect(JSON.stringify(summary).length).toBeLessThan(JSON.stringify(full).length);
		const bad = await owner.fetch(planUrl(referencePlanId, '/results?detail=everything'));
		expect(paths((await body<{ issues: Issue[] }>(bad, 422)).issues)).toEqual(['detail']);
	});

	it('gives a partial budget of no change against itself, and the difference in net return against another plan', async () => {
		const [self, alternative, plain, wideRow] = await Promise.all([
			results(referencePlanId, `?against=${referencePlanId}`),
			results(referencePlanId, `?against=${wideRowPlanId}`),
			results(referencePlanId),
			results(wideRowPlanId)
		]);
		for (const part of [...self.partialBudget!.years, self.partialBudget!.average]) {
			expect(part.netChangeUsd).toBeCloseTo(0, 6);
		}
		expect(alternative.partialBudget!.referencePlanName).toBe(
			scenario('wide-row-interseeded').plan.name
		);
		expect(Math.abs(alternative.partialBudget!.average.netChangeUsd)).toBeGreaterThan(1);
		// A partial budget's net change is the change in net return (added returns + reduced costs −
		// added costs − reduced returns): this plan's net return less the other's, year by year.
		alternative.partialBudget!.years.forEach((year, i) => {
			expect(year.netChangeUsd).toBeCloseTo(
				plain.farmYears[i].netReturnUsd - wideRow.farmYears[i].netReturnUsd,
				4
			);
		});
		expect(plain.partialBudget).toBeUndefined();
	});

	it("answers an unsaved draft's results without saving it", async () => {
		const saved = await getPlan(referencePlanId);
		const draft = withRotation(draftOf(saved), 'north-flat', wideRows);
		const response = await owner.json(planUrl(referencePlanId, '/results'), 'POST', draft);
		const live = await body<PlanSummary>(response, 200);
		const stored = await results(referencePlanId);
		const northFlat = (r: PlanSummary) => r.fields.find((f) => f.fieldId === 'north-flat')!;
		expect(northFlat(live).rotationId).toBe(wideRows);
		expect(northFlat(stored).rotationId).toBe('corn-soybean');
		expect(northFlat(live).netReturnUsdByYear).not.toEqual(northFlat(stored).netReturnUsdByYear);
		expect(live.farmYears[0].netReturnUsd).not.toBeCloseTo(stored.farmYears[0].netReturnUsd, 0);
		// A field the draft leaves alone returns the same.
		const creek = (r: PlanSummary) => r.fields.find((f) => f.fieldId === 'creek-bottom')!;
		expect(creek(live).netReturnUsdByYear).toEqual(creek(stored).netReturnUsdByYear);
		expect((await getPlan(referencePlanId)).version).toBe(saved.version);

		const full = await owner.json(planUrl(referencePlanId, '/results?detail=full'), 'POST', draft);
		expect((await body<PlanResult>(full, 200)).fieldYears).toHaveLength(
			saved.plan.fieldRotations.length * 5
		);
		const broken = withRotation(draft, 'creek-bottom', 'no-such-rotation');
		const refused = await owner.json(planUrl(referencePlanId, '/results'), 'POST', broken);
		const creekIndex = broken.plan.fieldRotations.findIndex((a) => a.fieldId === 'creek-bottom');
		expect(paths((await body<{ issues: Issue[] }>(refused, 422)).issues)).toEqual([
			`plan.fieldRotations.${creekIndex}.rotationId`
		]);
	});
});

describe('plan files', () => {
	it('exports a version as a plan file that imports again as a plan with the same results', async () => {
		const response = await owner.fetch(planUrl(referencePlanId, '/file'));
		expect(response.headers.get('content-disposition')).toMatch(
			/^attachment; filename=".+-v1\.json"$/
		);
		const file = await body<unknown>(response, 200);
		const parsed = parsePlanDocument(file);
		expect(parsed.ok, JSON.stringify(!parsed.ok && parsed.issues)).toBe(true);
		if (!parsed.ok) return;
		expect(parsed.plan.plan.name).toBe(referenceDoc.plan.name);
		expect(parsed.plan.fields).toHaveLength(referenceDoc.fields.length);

		const before = await farmSnapshot(db, farmId);
		const imported = await owner.json(`${plansUrl()}/import`, 'POST', file);
		const { plan } = await body<{ plan: { id: string; version: number } }>(imported, 201);
		expect(plan.id).not.toBe(referencePlanId);
		expect(await getPlan(plan.id)).toMatchObject({ isReference: false, version: 1 });
		const [original, again] = await Promise.all([
			results<PlanResult>(referencePlanId, '?detail=full'),
			results<PlanResult>(plan.id, '?detail=full')
		]);
		expect(again).toEqual(original);
		// The farm already had every part the file names: only the import's audit entry is new.
		const after = await farmSnapshot(db, farmId);
		expect({ ...after, auditRows: [] }).toEqual({ ...before, auditRows: [] });
		expect(after.auditRows).toHaveLength(before.auditRows.length + 1);

		expect((await owner.fetch(planUrl(referencePlanId, '/file?version=7'))).status).toBe(404);
		const badVersion = await owner.fetch(planUrl(referencePlanId, '/file?version=first'));
		expect(paths((await body<{ issues: Issue[] }>(badVersion, 422)).issues)).toEqual(['version']);
	});

	it('refuses a malformed plan file naming each problem, and saves nothing', async () => {
		const file = scenario('reference');
		file.fields[2].acres = -40;
		file.plan.fieldRotations[1].rotationId = 'corn-soy';
		const before = await farmSnapshot(db, farmId);
		const plansBefore = await listPlans();
		const response = await owner.json(`${plansUrl()}/import`, 'POST', file);
		const answer = await body<{ message: string; issues: Issue[] }>(response, 422);
		expect(answer.message).toContain('nothing was saved');
		expect(paths(answer.issues)).toEqual(
			expect.arrayContaining(['fields.2.acres', 'plan.fieldRotations.1.rotationId'])
		);
		expect(await farmSnapshot(db, farmId)).toEqual(before);
		expect(await listPlans()).toEqual(plansBefore);
	});
});
