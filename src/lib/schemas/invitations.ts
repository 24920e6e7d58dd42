import { z } from 'zod';
import { emailSchema } from './account';
import { amount, choice } from './messages';

/** The roles an owner can invite someone to: a farm has its owners already. */
export const invitableRoles = ['editor', 'reviewer'] as const;
export type InvitableRole = (typeof invitableRoles)[number];

/** An owner's invitation: the form's and the API's one shape. */
export const invitationSchema = z.object({
	email: z
		.string({ error: 'Enter the e-mail address to invite.' })
		.trim()
		.toLowerCase()
		.pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' })),
	role: choice('role', invitableRoles)
});
export type InvitationInput = z.infer<typeof invitationSchema>;

/** What the admin's captured-mail list reads from its query string. */
export const capturedMailQuerySchema = z.object({
	to: emailSchema.optional(),
	limit: z.coerce
		.number({ error: 'Enter the limit as a number.' })
		.pipe(amount('the limit', { min: 1, max: 500, integer: true }))
		.default(50)
});
