// What the people page and API share: refusals worded once, and the form's start for a new person.
import { MONTH_NAMES } from '$lib/months';
import { setError, type SuperValidated } from 'sveltekit-superforms';
import { personFormSchema, type PersonForm } from '$lib/schemas/people';
import { invalidValue } from '$lib/server/api';
import type { FamilyHoursTooHigh } from '$lib/server/db/people';
import { zod4 } from 'sveltekit-superforms/adapters';

export function personKeyTakenMessage(key: string): string {
	return `Another person on this farm has the key "${key}": choose another.`;
}

/** Why a people write was refused: the family's summed hours in a month past a farm's bound. */
export function familyHoursTooHighMessage({ month, hours, max }: FamilyHoursTooHigh): string {
	const figure = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 1 });
	return `The family's hours in ${MONTH_NAMES[month]} would be ${figure(hours)}: a farm's labour is at most ${figure(max)} hours a month.`;
}

/** The API's 422 for it, on the person's hours in that month. */
export function familyHoursRefusal(tooHigh: FamilyHoursTooHigh) {
	return invalidValue(`hoursAvailableByMonth.${tooHigh.month}`, familyHoursTooHighMessage(tooHigh));
}

/** The form's 400 for it, beside the month's input. */
export function familyHoursFormFailure(
	form: SuperValidated<PersonForm>,
	tooHigh: FamilyHoursTooHigh
) {
	return setError(
		form,
		`hoursAvailableByMonth[${tooHigh.month}]`,
		familyHoursTooHighMessage(tooHigh)
	);
}

/** The people form's schema, built once (the form library caches per schema). */
export const personFormAdapter = zod4(personFormSchema);

/** A new person's form: family, with 0 hours in each of the 12 months to fill in. */
export const newPersonValues = {
	role: 'family' as const,
	hoursAvailableByMonth: Array.from({ length: 12 }, () => 0)
};
