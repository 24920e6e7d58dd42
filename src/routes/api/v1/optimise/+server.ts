import { json } from '@sveltejs/kit';
import type { FieldIssue } from '$lib/schemas/issues';
import { toFieldIssues } from '$lib/schemas/issues';
import { optimiseRequestSchema } from '$lib/schemas/optimise';
import { parsePlanDocument } from '$lib/schemas/plan-file';
import { readJson, optionsRefused } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/access';
import { optimisePlan } from '$lib/server/optimiser/optimise';
import type { RequestHandler } from './$types';

/**
 * The best rotation mix for a plan file, as `npm run plan -- optimise` prints it. The body is
 * `{ "plan": <plan document>, "options": <limits, weights, whole fields> }`. Invalid input: 422 with
 * each problem's path (`plan.…`, `options.…`). A plan that no mix fits is an answer (status
 * "infeasible" with the conflicting limits), not an error.
 */
export const POST: RequestHandler = async (event) => {
	requireUser(event);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;
	const request = optimiseRequestSchema.safeParse(body.body);
	const plan = parsePlanDocument(request.success ? request.data.plan : undefined);
	const issues: FieldIssue[] = [
		...(request.success ? [] : toFieldIssues(request.error)),
		...(request.success && !plan.ok ? prefixed('plan', plan.issues) : [])
	];
	if (!request.success || !plan.ok) {
		return json({ message: 'The input is not valid.', issues }, { status: 422 });
	}
	const optimised = await optimisePlan(plan.plan, request.data.options);
	if (!optimised.ok) {
		return optionsRefused(prefixed('options', optimised.issues));
	}
	return json(optimised.result);
};

function prefixed(prefix: string, issues: FieldIssue[]): FieldIssue[] {
	return issues.map(({ path, message }) => ({
		path: path === '(document)' ? prefix : `${prefix}.${path}`,
		message
	}));
}
