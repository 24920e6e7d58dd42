import type { z } from 'zod';

/** One problem with one input value, named by its path (`fields.3.acres`). */
export interface FieldIssue {
	path: string;
	message: string;
}

/** Turns zod issues into path-named messages: the one error vocabulary of forms, API routes, CLI and CSV. */
export function toFieldIssues(error: z.ZodError): FieldIssue[] {
	return error.issues.map((issue) => ({
		path: issue.path.length ? issue.path.map(String).join('.') : '(document)',
		message: issue.message
	}));
}

/** The first message for each path, for showing beside form inputs. */
export function toFieldErrors(error: z.ZodError): Record<string, string> {
	const errors: Record<string, string> = {};
	for (const { path, message } of toFieldIssues(error)) errors[path] ??= message;
	return errors;
}
