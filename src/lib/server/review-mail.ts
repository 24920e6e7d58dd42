// The e-mails of plan review: a share tells the reviewers, a comment or decision tells the owners and
// editors. Each links straight to the plan version, by an absolute address on the app's origin.
import { decisionLabels } from '$lib/review-state';
import type { ReviewDecision } from '$lib/schemas/reviews';

export interface MailMessage {
	to: string;
	subject: string;
	text: string;
}

interface PlanRef {
	origin: string;
	farmId: string;
	farmName: string;
	planId: string;
	planName: string;
	version: number;
}

/** The plan version's page, absolute: where every review e-mail points. */
export function planVersionUrl({ origin, farmId, planId, version }: PlanRef) {
	return new URL(`/farms/${farmId}/plans/${planId}?version=${version}`, origin).href;
}

/** The printable report of the plan version, absolute. */
export function planReportUrl({ origin, farmId, planId, version }: PlanRef) {
	return new URL(`/farms/${farmId}/plans/${planId}/report?version=${version}`, origin).href;
}

const caution =
	'Furrowcast results are estimates from the numbers the farm entered. Nitrogen rates must follow local regulations, a current soil test and licensed advice; credit decisions rest with the lender.';

const quoted = (text: string) =>
	text
		.split('\n')
		.map((line) => `> ${line}`)
		.join('\n');

/** To each reviewer: a plan version waits for their review. */
export function shareMessages(
	plan: PlanRef,
	sharedBy: string,
	message: string,
	reviewers: { email: string }[]
): MailMessage[] {
	const subject = `For your review: "${plan.planName}", version ${plan.version} (${plan.farmName})`;
	const text = [
		`${sharedBy} shared version ${plan.version} of the plan "${plan.planName}" on ${plan.farmName} for your review.`,
		...(message ? ['', quoted(message)] : []),
		'',
		`Open the plan version: ${planVersionUrl(plan)}`,
		`Printable report: ${planReportUrl(plan)}`,
		'',
		'On the plan page you can comment, approve it, or ask for changes.',
		'',
		caution
	].join('\n');
	return reviewers.map(({ email }) => ({ to: email, subject, text }));
}

/** To each owner and editor: a reviewer commented on a plan version, or decided on it. */
export function reviewMessages(
	plan: PlanRef,
	reviewer: string,
	review: { comment: string; decision?: ReviewDecision },
	recipients: { email: string }[]
): MailMessage[] {
	const what = review.decision
		? `${decisionLabels[review.decision]} by ${reviewer}`
		: `Comment from ${reviewer}`;
	const subject = `"${plan.planName}", version ${plan.version}: ${what} (${plan.farmName})`;
	const lead = review.decision
		? review.decision === 'approved'
			? `${reviewer} approved version ${plan.version} of the plan "${plan.planName}" on ${plan.farmName}.`
			: `${reviewer} asked for changes to version ${plan.version} of the plan "${plan.planName}" on ${plan.farmName}.`
		: `${reviewer} commented on version ${plan.version} of the plan "${plan.planName}" on ${plan.farmName}.`;
	const text = [
		lead,
		...(review.comment ? ['', quoted(review.comment)] : []),
		'',
		`Open the plan version: ${planVersionUrl(plan)}`,
		...(review.decision === 'changes_requested'
			? ['', 'Edit the plan, save it as a new version and share that version for review again.']
			: []),
		'',
		caution
	].join('\n');
	return recipients.map(({ email }) => ({ to: email, subject, text }));
}
