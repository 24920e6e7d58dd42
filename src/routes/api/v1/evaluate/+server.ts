import { json } from '@sveltejs/kit';
import { evaluatePlan, NonFiniteResultError, referenceHorizonIssues } from '$lib/engine';
import type { FieldIssue } from '$lib/schemas/issues';
import { parsePlanDocument } from '$lib/schemas/plan-file';
import { readJson } from '$lib/server/api';
import { requireUser } from '$lib/server/auth/access';
import type { RequestHandler } from './$types';

/**
 * Evaluates a plan document and answers what `npm run plan -- evaluate` prints. The body is a plan
 * document, or `{ "document": <plan>, "against": <reference plan> }` for a partial budget too.
 * Invalid input: 422 with each problem's path (prefixed `document.` / `against.` in the second form).
 */
export const POST: RequestHandler = async (event) => {
	requireUser(event);
	const body = await readJson(event.request);
	if (!body.ok) return body.response;

	const { document, against, prefix } = splitBody(body.body);
	const plan = parsePlanDocument(document);
	const reference = against === undefined ? undefined : parsePlanDocument(against);
	const issues: FieldIssue[] = [
		...(plan.ok ? [] : withPrefix(prefix.document, plan.issues)),
		...(reference && !reference.ok ? withPrefix(prefix.against, reference.issues) : [])
	];
	if (plan.ok && reference?.ok) {
		issues.push(...withPrefix(prefix.document, referenceHorizonIssues(plan.plan, reference.plan)));
	}
	if (issues.length || !plan.ok || (reference && !reference.ok)) {
		return json({ message: 'The plan document is not valid.', issues }, { status: 422 });
	}
	try {
		return json(evaluatePlan(plan.plan, reference?.plan));
	} catch (error) {
		if (!(error instanceof NonFiniteResultError)) throw error;
		return json(
			{ message: 'The plan gives a result that is not a number.', issues: error.issues },
			{ status: 422 }
		);
	}
};

function splitBody(body: unknown) {
	const isEnvelope =
		typeof body === 'object' && body !== null && !('formatVersion' in body) && 'document' in body;
	if (!isEnvelope)
		return { document: body, against: undefined, prefix: { document: '', against: '' } };
	const { document, against } = body as { document: unknown; against?: unknown };
	return { document, against, prefix: { document: 'document', against: 'against' } };
}

function withPrefix(prefix: string, issues: FieldIssue[]): FieldIssue[] {
	if (!prefix) return issues;
	return issues.map(({ path, message }) => ({
		path: path === '(document)' ? prefix : `${prefix}.${path}`,
		message
	}));
}
