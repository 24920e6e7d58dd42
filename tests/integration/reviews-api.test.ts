// Sharing plan versions for review and reviewing them, through the API and the plan page's forms: the
// state of each version through edits, shares and decisions; every refusal (a reviewer editing or
// sharing, an owner or editor deciding, a non-member, bad bodies) leaves the database as it was; each
// share, comment and decision is audited and e-mailed (read back from the local mail sink's store),
// linking straight to the plan version. Also the report page, the reviewer's home and the farm's record.
import { and, arrayContains, asc, desc, eq, inArray } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	auditLog,
	capturedMail,
	comments,
	memberships,
	planShares,
	planVersions,
	reviews,
	users
} from '../../src/lib/server/db/schema';
import { evaluatePlan } from '../../src/lib/engine';
import { breakEven } from '../../src/lib/engine/risk/break-even';
import { cashFlow } from '../../src/lib/engine/risk/cash-flow';
import { formatNumber, formatUsd } from '../../src/lib/format';
import { MONTH_NAMES } from '../../src/lib/months';
import { parsePlanDocument, type PlanDocument } from '../../src/lib/schemas/plan-file';
import { testDb } from '../support/db';
import { addMember } from '../support/farms';
import { newUser, registerUser, type Client } from '../support/http';
import { baseUrl } from '../support/server';
import { importReferencePlan, ownFarm } from './farm-setup-support';

const db = testDb();

let owner: Client;
let editor: Client;
let reviewer: Client;
let outsider: Client;
let farmId: string;
let referencePlanId: string;
let planId: string;
const emails = { owner: '', editor: '', reviewer: '' };

const planUrl = (rest = '', plan = planId) => `/api/v1/farms/${farmId}/plans/${plan}${rest}`;

async function body<T>(response: Response, status: number): Promise<T> {
	expect(response.status, await response.clone().text()).toBe(status);
	return (await response.json()) as T;
}

interface VersionState {
	version: number;
	state: string;
	by: string | null;
	at: string | null;
}
interface Entry {
	id: string;
	kind: string;
	version: number;
	by: string;
	text: string;
}

async function reviewOf(client = owner) {
	return body<{ versions: VersionState[]; entries: Entry[] }>(
		await client.fetch(planUrl('/reviews')),
		200
	);
}
const stateOf = async (version: number) =>
	(await reviewOf()).versions.find((v) => v.version === version)!.state;

/** Every row a share or review could write for this farm's plans: shares, comments, reviews, audit,
 * each in a fixed order so two reads compare equal whatever plan PostgreSQL picks. */
async function reviewRows() {
	const versionIds = (
		await db
			.select({ id: planVersions.id })
			.from(planVersions)
			.where(inArray(planVersions.planId, [planId, referencePlanId]))
	).map((v) => v.id);
	const [shareRows, commentRows, reviewRowsNow, auditRows, versionRows] = await Promise.all([
		db
			.select()
			.from(planShares)
			.where(inArray(planShares.planVersionId, versionIds))
			.orderBy(asc(planShares.id)),
		db
			.select()
			.from(comments)
			.where(inArray(comments.planVersionId, versionIds))
			.orderBy(asc(comments.id)),
		db
			.select()
			.from(reviews)
			.where(inArray(reviews.planVersionId, versionIds))
			.orderBy(asc(reviews.id)),
		db.select().from(auditLog).where(eq(auditLog.farmId, farmId)).orderBy(asc(auditLog.id)),
		db
			.select()
			.from(planVersions)
			.where(inArray(planVersions.id, versionIds))
			.orderBy(asc(planVersions.id))
	]);
	return { shareRows, commentRows, reviewRowsNow, auditRows, versionRows };
}

/** Mail the sink caught for `to` with a subject containing `subject` (the sink stores it as it arrives). */
async function mailTo(to: string, subject: string) {
	const find = () =>
		db
			.select()
			.from(capturedMail)
			.where(arrayContains(capturedMail.envelopeTo, [to]))
			.orderBy(desc(capturedMail.receivedAt))
			.then((rows) => rows.filter((m) => m.subject.includes(subject)));
	await expect.poll(async () => (await find()).length).toBeGreaterThan(0);
	return (await find())[0];
}

async function lastAudit() {
	const [row] = await db
		.select()
		.from(auditLog)
		.where(eq(auditLog.farmId, farmId))
		.orderBy(desc(auditLog.id))
		.limit(1);
	return row;
}

/** Saves the plan's newest version again with one field's phase moved on: a new version. */
async function edit(client = owner) {
	const { plan } = await body<{
		plan: { version: number; plan: { fieldRotations: { startingPhase: number }[] } } & Record<
			string,
			unknown
		>;
	}>(await client.fetch(planUrl()), 200);
	const { id: _id, name: _name, isReference: _ref, version, ...draft } = plan;
	const changed = structuredClone(draft) as typeof draft;
	changed.plan.fieldRotations[0].startingPhase =
		changed.plan.fieldRotations[0].startingPhase === 1 ? 2 : 1;
	return client.json(planUrl(), 'PUT', { ...changed, baseVersion: version, changeNote: 'edited' });
}

beforeAll(async () => {
	({ owner, farmId } = await ownFarm('reviews'));
	await importReferencePlan(db, farmId);
	const listed = await body<{ plans: { id: string; isReference: boolean }[] }>(
		await owner.fetch(`/api/v1/farms/${farmId}/plans`),
		200
	);
	referencePlanId = listed.plans.find((p) => p.isReference)!.id;
	const copy = await owner.json(planUrl('/copy', referencePlanId), 'POST', {
		name: 'Reviewed plan'
	});
	planId = (await body<{ plan: { id: string } }>(copy, 201)).plan.id;
	const [editorAccount, reviewerAccount] = await Promise.all([
		registerUser('reviews-editor'),
		registerUser('reviews-reviewer')
	]);
	editor = editorAccount.client;
	reviewer = reviewerAccount.client;
	emails.editor = editorAccount.email;
	emails.reviewer = reviewerAccount.email;
	await Promise.all([
		addMember(db, farmId, editorAccount.email, 'editor'),
		addMember(db, farmId, reviewerAccount.email, 'reviewer')
	]);
	outsider = await newUser('reviews-outsider');
	const [ownerRow] = await db
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(and(eq(memberships.farmId, farmId), eq(memberships.role, 'owner')));
	emails.owner = ownerRow.email;
});

describe('refusals that change nothing', () => {
	it('a reviewer may neither edit, restore nor share a plan (403)', async () => {
		const before = await reviewRows();
		expect((await edit(reviewer)).status).toBe(403);
		expect(
			(await reviewer.json(planUrl('/versions'), 'POST', { version: 1, baseVersion: 1 })).status
		).toBe(403);
		expect((await reviewer.json(planUrl('/share'), 'POST', {})).status).toBe(403);
		expect(await reviewRows()).toEqual(before);
	});

	it('an owner or editor may not comment or decide (403)', async () => {
		const before = await reviewRows();
		for (const client of [owner, editor]) {
			const response = await client.json(planUrl('/reviews'), 'POST', {
				comment: 'Looks good to me.',
				decision: 'approved'
			});
			expect(response.status).toBe(403);
		}
		expect(await reviewRows()).toEqual(before);
	});

	it('a non-member gets 404 for every review route, and for the report', async () => {
		const before = await reviewRows();
		expect((await outsider.fetch(planUrl('/reviews'))).status).toBe(404);
		expect((await outsider.json(planUrl('/reviews'), 'POST', { comment: 'Hello' })).status).toBe(
			404
		);
		expect((await outsider.json(planUrl('/share'), 'POST', {})).status).toBe(404);
		expect((await outsider.fetch(`/farms/${farmId}/plans/${planId}/report?version=1`)).status).toBe(
			404
		);
		expect(await reviewRows()).toEqual(before);
	});

	it('bad bodies get 422 naming the value, and nothing is saved', async () => {
		const before = await reviewRows();
		const bad: [Client, string, unknown, string][] = [
			[reviewer, '/reviews', { comment: '' }, 'comment'],
			[reviewer, '/reviews', { comment: 'x', decision: 'maybe' }, 'decision'],
			[reviewer, '/reviews', { comment: 'x'.repeat(4001) }, 'comment'],
			[reviewer, '/reviews', { comment: 'x', version: 'two' }, 'version'],
			[reviewer, '/reviews', { comment: 'x', version: 99 }, 'version'],
			[reviewer, '/reviews', { comment: 'x', score: 5 }, '(document)'],
			[owner, '/share', { message: 'x'.repeat(1001) }, 'message'],
			[owner, '/share', { version: 0 }, 'version']
		];
		for (const [client, path, sent, where] of bad) {
			const answer = await body<{ issues: { path: string }[] }>(
				await client.json(planUrl(path), 'POST', sent),
				422
			);
			expect(answer.issues.map((i) => i.path)).toContain(where);
		}
		expect((await reviewer.json(planUrl('/reviews'), 'POST', '{"comment":')).status).toBe(400);
		expect(await reviewRows()).toEqual(before);
	});

	it('a decision on a version not shared gets 409; a comment on it is taken', async () => {
		const before = await reviewRows();
		const refused = await reviewer.json(planUrl('/reviews'), 'POST', {
			comment: 'Fine',
			decision: 'approved'
		});
		expect(refused.status).toBe(409);
		expect(await reviewRows()).toEqual(before);
		expect(await stateOf(1)).toBe('not_shared');
	});
});

describe('sharing, comments and decisions through the versions', () => {
	it('an owner shares version 1: it awaits review, the reviewer is e-mailed a link to it', async () => {
		const shared = await body<{ share: { version: number; state: string; notified: number } }>(
			await owner.json(planUrl('/share'), 'POST', { version: 1, message: 'First look, please.' }),
			201
		);
		expect(shared.share).toMatchObject({ version: 1, state: 'awaiting_review', notified: 1 });
		const state = (await reviewOf(reviewer)).versions.find((v) => v.version === 1)!;
		expect(state).toMatchObject({ state: 'awaiting_review', by: 'Test reviews' });
		expect(await lastAudit()).toMatchObject({
			action: 'plan.shared',
			detail: { planId, name: 'Reviewed plan', version: 1 }
		});
		const mail = await mailTo(emails.reviewer, '"Reviewed plan", version 1');
		expect(mail.text).toContain(`${baseUrl}/farms/${farmId}/plans/${planId}?version=1`);
		expect(mail.text).toContain('First look, please.');
	});

	it('a version awaiting review, or one that is not the newest, is not shared again (409)', async () => {
		const before = await reviewRows();
		expect((await owner.json(planUrl('/share'), 'POST', {})).status).toBe(409);
		expect((await editor.json(planUrl('/share'), 'POST', { version: 2 })).status).toBe(409);
		expect(await reviewRows()).toEqual(before);
	});

	it('the reviewer comments, then asks for changes: the owner and editor are e-mailed each', async () => {
		const comment = await body<{ review: { kind: string; state: string; version: number } }>(
			await reviewer.json(planUrl('/reviews'), 'POST', { comment: 'Why less hay in 2028?' }),
			201
		);
		expect(comment.review).toMatchObject({ kind: 'comment', state: 'awaiting_review', version: 1 });
		const asked = await body<{ review: { state: string; notified: number } }>(
			await reviewer.json(planUrl('/reviews'), 'POST', {
				comment: 'Show the hay bill with half the grazing.',
				decision: 'changes_requested',
				version: 1
			}),
			201
		);
		expect(asked.review).toMatchObject({ state: 'changes_requested', notified: 2 });
		expect(await stateOf(1)).toBe('changes_requested');
		expect(await lastAudit()).toMatchObject({
			action: 'plan.reviewed',
			detail: { planId, version: 1, kind: 'changes_requested' }
		});
		for (const to of [emails.owner, emails.editor]) {
			const mail = await mailTo(to, 'Changes requested');
			expect(mail.text).toContain(`${baseUrl}/farms/${farmId}/plans/${planId}?version=1`);
			expect(mail.text).toContain('Show the hay bill with half the grazing.');
		}
		await mailTo(emails.owner, 'Comment from');
		const { entries } = await reviewOf(editor);
		expect(entries.map((e) => [e.kind, e.version])).toEqual([
			['share', 1],
			['comment', 1],
			['changes_requested', 1]
		]);
	});

	it('an edit makes version 2, not shared; shared, then approved; version 1 keeps its state', async () => {
		expect((await edit(editor)).status).toBe(200);
		expect(await stateOf(2)).toBe('not_shared');
		expect((await editor.json(planUrl('/share'), 'POST', { version: 2 })).status).toBe(201);
		expect(await stateOf(2)).toBe('awaiting_review');
		const approved = await reviewer.json(planUrl('/reviews'), 'POST', {
			comment: '',
			decision: 'approved'
		});
		expect((await body<{ review: { version: number } }>(approved, 201)).review.version).toBe(2);
		expect(await stateOf(2)).toBe('approved');
		expect(await stateOf(1)).toBe('changes_requested');
		await mailTo(emails.owner, 'version 2: Approved by');
	});

	it('an approved version is not shared again; editing it makes version 3, which awaits review once shared', async () => {
		const before = await reviewRows();
		expect((await owner.json(planUrl('/share'), 'POST', {})).status).toBe(409);
		expect(await reviewRows()).toEqual(before);
		const approvedRow = before.versionRows.find((v) => v.version === 2 && v.planId === planId);

		expect((await edit(owner)).status).toBe(200);
		const after = await reviewOf();
		expect(after.versions.map((v) => [v.version, v.state])).toEqual([
			[3, 'not_shared'],
			[2, 'approved'],
			[1, 'changes_requested']
		]);
		// Version 2 is as it was approved: its row is untouched by the edit.
		const [stillApproved] = await db
			.select()
			.from(planVersions)
			.where(and(eq(planVersions.planId, planId), eq(planVersions.version, 2)));
		expect(stillApproved).toEqual(approvedRow);

		expect((await owner.json(planUrl('/share'), 'POST', { version: 3 })).status).toBe(201);
		expect(await stateOf(3)).toBe('awaiting_review');
		expect(await stateOf(2)).toBe('approved');
	});

	it('a restore is recorded as a restore', async () => {
		const restored = await owner.json(planUrl('/versions'), 'POST', { version: 2, baseVersion: 3 });
		expect(restored.status).toBe(201);
		expect(await lastAudit()).toMatchObject({
			action: 'plan.restored',
			detail: { planId, version: 4, fromVersion: 2 }
		});
		expect(await stateOf(4)).toBe('not_shared');
	});
});

describe('the plan page forms, without JavaScript', () => {
	const page = () => `/farms/${farmId}/plans/${planId}`;

	it('an owner shares the newest version; the reviewer comments with an empty decision', async () => {
		const shared = await owner.postForm(`${page()}?/share`, { version: '4', message: '' });
		expect(shared.status).toBe(303);
		expect(shared.headers.get('location')).toBe(`${page()}?version=4&shared=1#review`);
		expect(await stateOf(4)).toBe('awaiting_review');
		const commented = await reviewer.postForm(`${page()}?/review`, {
			version: '4',
			comment: 'Restored the approved one: fine.',
			decision: ''
		});
		expect(commented.status).toBe(303);
		expect((await reviewOf()).entries.at(-1)).toMatchObject({
			kind: 'comment',
			version: 4,
			text: 'Restored the approved one: fine.'
		});
	});

	it('refuses a bad form with 400 and saves nothing; an editor may not use the review form', async () => {
		const before = await reviewRows();
		const empty = await reviewer.action(`${page()}?/review`, { version: '4', comment: ' ' });
		expect(empty).toMatchObject({ type: 'failure', status: 400 });
		expect(empty.data).toContain('Write a comment, or give a decision with it.');
		const editorTry = await editor.postForm(`${page()}?/review`, {
			version: '4',
			comment: 'x',
			decision: 'approved'
		});
		expect(editorTry.status).toBe(403);
		const reviewerShare = await reviewer.postForm(`${page()}?/share`, { version: '4' });
		expect(reviewerShare.status).toBe(403);
		expect(await reviewRows()).toEqual(before);
	});

	it('the reviewer approves version 4 through the form', async () => {
		const approved = await reviewer.postForm(`${page()}?/review`, {
			version: '4',
			comment: 'Approved.',
			decision: 'approved'
		});
		expect(approved.status).toBe(303);
		expect(await stateOf(4)).toBe('approved');
	});
});

describe('pages built on the review', () => {
	it('the report of a version names the farm, its review and the cautions', async () => {
		const response = await reviewer.fetch(`/farms/${farmId}/plans/${planId}/report?version=1`);
		expect(response.status).toBe(200);
		const html = await response.text();
		for (const text of [
			'Reviewed plan, version 1',
			'reviews farm',
			'Changes requested',
			'Show the hay bill with half the grazing.',
			'Credit decisions rest with the lender',
			'Partial budget against the reference plan',
			'id="risk-and-cash-flow"'
		]) {
			expect(html).toContain(text);
		}
		expect(
			(await reviewer.fetch(`/farms/${farmId}/plans/${planId}/report?version=99`)).status
		).toBe(404);
	});

	it("lists the reviewer's plans on /farms, what awaits review first", async () => {
		// The reference plan shared: it awaits review, so it comes before the approved plan.
		expect((await owner.json(planUrl('/share', referencePlanId), 'POST', {})).status).toBe(201);
		const html = await (await reviewer.fetch('/farms')).text();
		const rows = [...html.matchAll(/data-plan-row="([^"]+)" data-state="([^"]+)"/g)].map((m) => [
			m[1],
			m[2]
		]);
		expect(rows).toEqual([
			[referencePlanId, 'awaiting_review'],
			[planId, 'approved']
		]);
		expect(html).toContain('One plan awaits your review.');
		// The owner reviews nothing: no such list.
		expect(await (await owner.fetch('/farms')).text()).not.toContain('data-plan-row');
	});

	it("shows the farm's record to owners only, filtered by person and by plan", async () => {
		expect((await editor.fetch(`/farms/${farmId}/audit`)).status).toBe(403);
		expect((await reviewer.fetch(`/farms/${farmId}/audit`)).status).toBe(403);
		expect((await outsider.fetch(`/farms/${farmId}/audit`)).status).toBe(404);
		const all = await (await owner.fetch(`/farms/${farmId}/audit`)).text();
		const actions = (html: string) => [...html.matchAll(/data-action="([^"]+)"/g)].map((m) => m[1]);
		expect(actions(all).slice(0, 3)).toEqual(['plan.shared', 'plan.reviewed', 'plan.reviewed']);
		const reviewerRow = await db.query.users.findFirst({
			where: (u, { eq }) => eq(u.email, emails.reviewer)
		});
		const byReviewer = await (
			await owner.fetch(`/farms/${farmId}/audit?person=${reviewerRow!.id}`)
		).text();
		expect(new Set(actions(byReviewer))).toEqual(new Set(['plan.reviewed']));
		const byPlan = await (
			await owner.fetch(`/farms/${farmId}/audit?plan=${referencePlanId}`)
		).text();
		expect(actions(byPlan)[0]).toBe('plan.shared');
		expect(actions(byPlan)).not.toContain('plan.reviewed');
		// A filter that is not an id filters nothing rather than failing.
		expect((await owner.fetch(`/farms/${farmId}/audit?person=nobody`)).status).toBe(200);
	});

	// Last: it saves the farm's cash-flow settings, an audit entry the farm's record test does not expect.
	it('the report of a version adds its break-even, cash flow and newest Monte Carlo run, as the engine works them out', async () => {
		const { plan } = await body<{ plan: { version: number } }>(await owner.fetch(planUrl()), 200);
		const current = plan.version;
		expect(current).toBeGreaterThan(1);
		const versionOne = await planFile(1);
		const settings = { startingCashUsd: 20_000, minimumBalanceUsd: 5_000 };
		const soldLate = versionOne.crops[0].id;
		const saved = await owner.postForm(`/farms/${farmId}/plans/${planId}/cash-flow`, {
			startingCashUsd: String(settings.startingCashUsd),
			minimumBalanceUsd: String(settings.minimumBalanceUsd),
			[`saleMonth:${soldLate}`]: '12'
		});
		expect(saved.status).toBe(303);

		const report = (version: number) =>
			reviewer.fetch(`/farms/${farmId}/plans/${planId}/report?version=${version}`);
		const html = await (await report(1)).text();

		// Break-even of one crop-year, from the engine on version 1's plan file (the risk page's own
		// computation: costs ÷ production, Iowa State Ag Decision Maker's textbook break-even).
		const result = evaluatePlan(versionOne);
		const found = breakEven(result);
		const year = found.years[0];
		const crop = year.crops.find((c) => c.breakEvenPriceUsdPerUnit !== null)!;
		expect(
			cellText(html, `crop-${year.year}-${crop.crop}`, 'break-even-price'),
			`${crop.cropName} ${year.year}`
		).toBe(`${formatUsd(crop.breakEvenPriceUsdPerUnit, 2)}/${crop.yieldUnit}`);
		expect(cellText(html, `farm-${year.year}`, 'price-fall')).toBe(
			formatNumber(year.farm.priceFallPercent, 1)
		);
		// The sensitivity table is there, one row per input (crop prices and yields, N, diesel, hay, labour).
		expect(html).toContain('data-testid="report-sensitivity"');
		expect(html).toMatch(/data-row="sensitivity-nitrogen-price"/);

		// The cash flow under the farm's settings as saved, at the farm's interest rate.
		const flow = cashFlow(result, {
			...settings,
			interestRatePercent: versionOne.farm.interestRatePercent,
			saleMonthByCrop: new Map([[soldLate, 12]]),
			feedingSeasonStartMonth: versionOne.herd?.feedingSeasonStartMonth ?? null
		});
		expect(flow.peakLoan).not.toBeNull();
		expect(testIdText(html, 'report-peak-loan')).toBe(formatUsd(flow.peakLoanUsd));
		expect(testIdText(html, 'report-peak-loan-month')).toContain(
			`at the end of ${MONTH_NAMES[flow.peakLoan!.month - 1]} ${flow.peakLoan!.year}`
		);
		for (const y of flow.years) {
			expect(cellText(html, `year-${y.year}`, 'peak-loan')).toBe(formatUsd(y.peakLoanUsd));
			expect(cellText(html, `year-${y.year}`, 'loan-interest')).toBe(formatUsd(y.loanInterestUsd));
		}
		expect(testIdText(html, 'report-cash-settings')).toContain(
			`Cash on hand at the start of ${flow.years[0].year}: $20,000`
		);

		// No Monte Carlo run yet: the report says so and where to run one.
		const before = await (await report(current)).text();
		expect(testIdText(before, 'monte-carlo-none')).toContain(
			`No Monte Carlo run of version ${current} has finished in the past week`
		);
		expect(before).toContain(`href="/farms/${farmId}/plans/${planId}/risk#monte-carlo"`);

		// A small run through the API, waited for on the job route: the report shows its percentiles.
		const started = await body<{ jobId: string }>(
			await owner.json(planUrl('/risk'), 'POST', { draws: 500, seed: 12 }),
			202
		);
		let job:
			| {
					state: string;
					result: {
						plan: { horizonAverage: { percentilesUsd: { p5: number; p50: number } } };
					} | null;
			  }
			| undefined;
		await expect
			.poll(
				async () => {
					job = await (await owner.fetch(`/api/v1/jobs/${started.jobId}`)).json();
					return job!.state;
				},
				{ timeout: 30_000, interval: 200 }
			)
			.toBe('completed');
		const after = await (await report(current)).text();
		expect(after).toContain('data-testid="monte-carlo-result"');
		const p = job!.result!.plan.horizonAverage.percentilesUsd;
		const average = rowText(after, 'spread-Average a year');
		expect(average).toContain(formatUsd(p.p5));
		expect(average).toContain(formatUsd(p.p50));
		// Version 1's report keeps saying it has no run of its own, and names the run there is.
		const old = testIdText(await (await report(1)).text(), 'monte-carlo-none');
		expect(old).toContain('No Monte Carlo run of version 1');
		expect(old).toContain(`The plan's newest run is of version ${current}.`);
	});
});

/** The plan file the farm makes of a version of the plan: what the report evaluates. */
async function planFile(version: number): Promise<PlanDocument> {
	const parsed = parsePlanDocument(
		await body<unknown>(await owner.fetch(planUrl(`/file?version=${version}`)), 200)
	);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	return parsed.plan;
}

/** The text of an element's content, tags dropped and white space run together. */
const textOf = (html: string) =>
	html
		.replace(/<[^>]*>/g, ' ')
		.replace(/&amp;/g, '&')
		.replace(/\s+/g, ' ')
		.trim();

/** The text of the table row marked `data-row="<row>"`. */
function rowText(html: string, row: string) {
	const start = html.indexOf(`data-row="${row}"`);
	expect(start, `row ${row}`).toBeGreaterThan(-1);
	return html.slice(start, html.indexOf('</tr>', start));
}

/** The text of the cell marked `data-cell="<cell>"` in that row. */
function cellText(html: string, row: string, cell: string) {
	const inRow = rowText(html, row);
	const start = inRow.indexOf(`data-cell="${cell}"`);
	expect(start, `cell ${cell} of ${row}`).toBeGreaterThan(-1);
	return textOf(inRow.slice(inRow.indexOf('>', start) + 1, inRow.indexOf('</td>', start)));
}

/** The text of the element marked `data-testid="<id>"` (up to its closing tag). */
function testIdText(html: string, id: string) {
	const start = html.indexOf(`data-testid="${id}"`);
	expect(start, `element ${id}`).toBeGreaterThan(-1);
	const tag = html.lastIndexOf('<', start);
	const name = /^<(\w+)/.exec(html.slice(tag))![1];
	return textOf(html.slice(html.indexOf('>', start) + 1, html.indexOf(`</${name}>`, start)));
}
