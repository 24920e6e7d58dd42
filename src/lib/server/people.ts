// What the people page and API share: refusals worded once, and the form's start for a new person.
import { personFormSchema } from '$lib/schemas/people';
import { zod4 } from 'sveltekit-superforms/adapters';

export function personKeyTakenMessage(key: string): string {
	return `Another person on this farm has the key "${key}": choose another.`;
}

/** The people form's schema, built once (the form library caches per schema). */
export const personFormAdapter = zod4(personFormSchema);

/** A new person's form: family, with 0 hours in each of the 12 months to fill in. */
export const newPersonValues = {
	role: 'family' as const,
	hoursAvailableByMonth: Array.from({ length: 12 }, () => 0)
};
