import type { PlanDraftInput } from '$lib/schemas/plans';

/**
 * What differs between two drafts of a plan, in words a person reads after a refused save: the fields
 * whose rotation or starting year changed, and the plan's years, herd and assumptions.
 */
export function planChanges(
	before: PlanDraftInput,
	after: PlanDraftInput,
	names: { fields: Map<string, string>; rotations: Map<string, string> }
): string[] {
	const changes: string[] = [];
	if (before.plan.name !== after.plan.name) changes.push(`Name: "${after.plan.name}"`);
	const { startYear, years } = after.plan.horizon;
	if (before.plan.horizon.startYear !== startYear || before.plan.horizon.years !== years) {
		changes.push(`Years: ${startYear} to ${startYear + years - 1}`);
	}
	const assignment = (draft: PlanDraftInput) =>
		new Map(draft.plan.fieldRotations.map((a) => [a.fieldId, a]));
	const was = assignment(before);
	const now = assignment(after);
	for (const fieldId of new Set([...was.keys(), ...now.keys()])) {
		const a = was.get(fieldId);
		const b = now.get(fieldId);
		if (a?.rotationId === b?.rotationId && (a?.startingPhase ?? 1) === (b?.startingPhase ?? 1)) {
			continue;
		}
		const field = names.fields.get(fieldId) ?? fieldId;
		changes.push(
			b
				? `${field}: ${names.rotations.get(b.rotationId) ?? b.rotationId}, starting with its year ${b.startingPhase ?? 1}`
				: `${field}: taken out of the plan`
		);
	}
	if (JSON.stringify(before.herd ?? null) !== JSON.stringify(after.herd ?? null)) {
		changes.push(after.herd ? `Herd: ${after.herd.head} head` : 'Herd: no cattle');
	}
	if (
		JSON.stringify(before.plan.assumptions ?? []) !== JSON.stringify(after.plan.assumptions ?? [])
	) {
		changes.push('Assumptions');
	}
	return changes;
}
