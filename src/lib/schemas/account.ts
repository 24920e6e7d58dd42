import { z } from 'zod';

export const emailSchema = z
	.string({ error: 'Enter your e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

// NIST SP 800-63B: at least 8 characters for a memorised secret; 64 or more must be allowed.
export const newPasswordSchema = z
	.string({ error: 'Choose a password.' })
	.min(8, { error: 'Use at least 8 characters.' })
	.max(200, { error: 'Use at most 200 characters.' });

export const signInSchema = z.object({
	email: emailSchema,
	password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' })
});

export const registerSchema = z
	.object({
		name: z
			.string({ error: 'Enter your name.' })
			.trim()
			.min(1, { error: 'Enter your name.' })
			.max(120, { error: 'Use at most 120 characters.' }),
		email: emailSchema,
		password: newPasswordSchema,
		confirmPassword: z.string({ error: 'Type the password again.' })
	})
	.refine((v) => v.password === v.confirmPassword, {
		path: ['confirmPassword'],
		error: 'The two passwords do not match.'
	});
