// Review states of a plan version from its shares and decisions, the review body's schema, the e-mails'
// links and the farm record's words. The rules are the product's own (no published source).
import { describe, expect, it } from 'vitest';
import { describeAuditEntry } from '../../src/lib/audit-words';
import { versionReviewState, type ReviewEvent } from '../../src/lib/review-state';
import { reviewSchema, shareSchema } from '../../src/lib/schemas/reviews';
import { planVersionUrl, reviewMessages, shareMessages } from '../../src/lib/server/review-mail';

const at = (minute: number) => new Date(Date.UTC(2026, 11, 3, 9, minute));
const share = (minute: number, by = 'Dana'): ReviewEvent => ({ kind: 'share', by, at: at(minute) });
const decide = (
	kind: 'approved' | 'changes_requested',
	minute: number,
	by = 'Sam'
): ReviewEvent => ({ kind, by, at: at(minute) });

describe('a version’s review state', () => {
	it('is not shared until someone shares it', () => {
		expect(versionReviewState([])).toEqual({ state: 'not_shared', by: null, at: null });
	});

	it('awaits review once shared, naming who shared it and when', () => {
		expect(versionReviewState([share(1)])).toEqual({
			state: 'awaiting_review',
			by: 'Dana',
			at: at(1)
		});
	});

	it('is the newest decision after the newest share, in whatever order the events come', () => {
		expect(
			versionReviewState([decide('approved', 5), share(1), decide('changes_requested', 3)])
		).toEqual({ state: 'approved', by: 'Sam', at: at(5) });
	});

	it('awaits review again when shared again after changes were requested', () => {
		const events = [share(1), decide('changes_requested', 2), share(4, 'Lee')];
		expect(versionReviewState(events)).toEqual({
			state: 'awaiting_review',
			by: 'Lee',
			at: at(4)
		});
		expect(versionReviewState([...events, decide('approved', 6)]).state).toBe('approved');
	});
});

describe('the review body', () => {
	it('takes a comment, a decision and a version', () => {
		expect(reviewSchema.parse({ comment: ' Fine. ', decision: 'approved', version: 2 })).toEqual({
			comment: 'Fine.',
			decision: 'approved',
			version: 2
		});
	});

	it('takes a decision without words, but not a comment that says nothing', () => {
		expect(reviewSchema.safeParse({ comment: '', decision: 'approved' }).success).toBe(true);
		const empty = reviewSchema.safeParse({ comment: '   ' });
		expect(empty.success).toBe(false);
		expect(empty.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['comment', 'Write a comment, or give a decision with it.']
		]);
	});

	it('refuses another decision, a version that is no version, a long comment and unknown keys', () => {
		for (const bad of [
			{ comment: 'x', decision: 'maybe' },
			{ comment: 'x', version: 0 },
			{ comment: 'x', version: 1.5 },
			{ comment: 'x'.repeat(4001) },
			{ comment: 'x', approve: true }
		]) {
			expect(reviewSchema.safeParse(bad).success, JSON.stringify(bad).slice(0, 60)).toBe(false);
		}
	});

	it('shares with an optional version and message', () => {
		expect(shareSchema.parse({})).toEqual({ message: '' });
		expect(shareSchema.safeParse({ message: 'x'.repeat(1001) }).success).toBe(false);
	});
});

describe('review e-mails', () => {
	const plan = {
		origin: 'https://plans.example.test',
		farmId: 'f1',
		farmName: 'Test Farm',
		planId: 'p1',
		planName: 'Reduced N',
		version: 3
	};

	it('link straight to the plan version, absolute on the origin', () => {
		expect(planVersionUrl(plan)).toBe('https://plans.example.test/farms/f1/plans/p1?version=3');
		const [mail] = shareMessages(plan, 'Dana', 'See the east fields.', [{ email: 'r@x.test' }]);
		expect(mail.to).toBe('r@x.test');
		expect(mail.subject).toContain('"Reduced N", version 3');
		expect(mail.text).toContain('https://plans.example.test/farms/f1/plans/p1?version=3');
		expect(mail.text).toContain('> See the east fields.');
		expect(mail.text).toContain('credit decisions rest with the lender');
	});

	it('go to every recipient, and say what the reviewer decided', () => {
		const mails = reviewMessages(
			plan,
			'Sam',
			{ comment: 'More hay, please.', decision: 'changes_requested' },
			[{ email: 'o@x.test' }, { email: 'e@x.test' }]
		);
		expect(mails.map((m) => m.to)).toEqual(['o@x.test', 'e@x.test']);
		expect(mails[0].subject).toContain('Changes requested by Sam');
		expect(mails[0].text).toContain('Sam asked for changes to version 3');
		expect(mails[0].text).toContain('?version=3');
	});
});

describe("the farm's record in words", () => {
	it('says what each review action did', () => {
		const detail = { planId: 'p', name: 'Reduced N', version: 2 };
		expect(describeAuditEntry('plan.shared', detail)).toBe(
			'shared plan “Reduced N”, version 2 for review'
		);
		expect(describeAuditEntry('plan.reviewed', { ...detail, kind: 'changes_requested' })).toBe(
			'asked for changes to plan “Reduced N”, version 2'
		);
		expect(describeAuditEntry('plan.restored', { ...detail, fromVersion: 1 })).toBe(
			'restored version 1 as plan “Reduced N”, version 2'
		);
	});

	it('words an action it does not know from its name, never as nothing', () => {
		expect(describeAuditEntry('invitation.revoked', { email: 'a@x.test', role: 'reviewer' })).toBe(
			'revoked the invitation “a@x.test” as reviewer'
		);
	});
});
