import { z } from 'zod';
import { id } from './messages';
import { personSchema, wageMessage } from './plan-file';

/**
 * A person as the people page and `/api/v1/farms/[farmId]/people` take them: the plan file's own person
 * schema, with its wage rule (hired help has a wage, the family none) in the words the plan file uses.
 * The API's `id` is the row's (it is in URLs); the plan file's person id is the `key`, made from the name.
 */

const checkWage = (person: z.output<typeof personForm>, ctx: z.RefinementCtx) => {
	const message = wageMessage(person);
	if (message) ctx.addIssue({ code: 'custom', path: ['wageUsdPerHour'], message });
};

const personForm = personSchema.omit({ id: true });

/** The people form: a person less their id (the key is made from the name). */
export const personFormSchema = personForm.superRefine(checkWage);
export type PersonForm = z.output<typeof personFormSchema>;

/** A person as the API takes them (POST; PATCH merges its body over the stored person first). */
export const personBodySchema = personForm
	.extend({ key: id('the person key').optional() })
	.superRefine(checkWage);
export type PersonBody = z.output<typeof personBodySchema>;
