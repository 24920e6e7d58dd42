import { z } from 'zod';

/**
 * The one voice of validation messages. Every value a person can type is built here with its label,
 * so each message names the value and says what is allowed ("Field area must be at most 20,000 acres.").
 * `fallbackMessage` words the issues no single value owns (unknown keys, a wrong kind of value).
 */

const figure = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 6 });
const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** How a bound is written: `20,000 acres`, `100 %`, `$5,000 per acre`. */
export interface Unit {
	/** Written after the number: 'acres', '%', 'lb N per acre'. */
	unit?: string;
	/** A dollar amount, written `$5 per <usdPer>` (or `$5` for an empty string). */
	usdPer?: string;
}

function quantity(n: number, { unit, usdPer }: Unit): string {
	if (usdPer !== undefined) return `$${figure(n)}${usdPer ? ` per ${usdPer}` : ''}`;
	return unit ? `${figure(n)} ${unit}` : figure(n);
}

export interface Range extends Unit {
	/** Smallest allowed value (inclusive). */
	min?: number;
	/** Values must be more than this (exclusive lower bound). */
	above?: number;
	/** Largest allowed value (inclusive): every number has one. */
	max: number;
	/** Whole numbers only (head of cattle, days, passes). */
	integer?: boolean;
}

/** A number a person enters, with its plausible range stated in the messages. */
export function amount(label: string, range: Range) {
	const subject = capitalise(label);
	let schema = z.number({ error: `Enter ${label} as a number.` });
	if (range.integer) schema = schema.int({ error: `${subject} must be a whole number.` });
	if (range.above !== undefined) {
		schema = schema.gt(range.above, {
			error: `${subject} must be more than ${quantity(range.above, range)}.`
		});
	}
	if (range.min !== undefined) {
		schema = schema.min(range.min, {
			error: `${subject} must be at least ${quantity(range.min, range)}.`
		});
	}
	return schema.max(range.max, {
		error: `${subject} must be at most ${quantity(range.max, range)}.`
	});
}

/** A share from 0 to 100 %. */
export function percent(label: string, range: Partial<Range> = {}) {
	return amount(label, { min: 0, max: 100, ...range, unit: '%' });
}

/** A month of the year as its number. */
export function month(label: string) {
	const message = `${capitalise(label)} must be a month from 1 (January) to 12 (December).`;
	return z
		.number({ error: message })
		.int({ error: message })
		.min(1, { error: message })
		.max(12, { error: message });
}

/** Free text with a length limit; `required` refuses an empty value. */
export function text(label: string, { max, required }: { max: number; required?: boolean }) {
	let schema = z.string({ error: `Enter ${label} as text.` }).trim();
	if (required) schema = schema.min(1, { error: `Enter ${label}.` });
	return schema.max(max, {
		error: `${capitalise(label)} must be at most ${figure(max)} characters.`
	});
}

/** A short id the file's parts refer to each other by. */
export function id(label: string) {
	return z
		.string({ error: `Enter ${label} as text.` })
		.max(60, { error: `${capitalise(label)} must be at most 60 characters.` })
		.regex(/^[a-z0-9][a-z0-9-]*$/, {
			error: `${capitalise(label)}: use lower-case letters, digits and hyphens (e.g. "north-flat").`
		});
}

/** One of a fixed set of words. */
export function choice<const T extends readonly [string, ...string[]]>(label: string, options: T) {
	return z.enum(options, {
		error: `${capitalise(label)} is one of: ${options.map((o) => `"${o}"`).join(', ')}.`
	});
}

export function yesNo(label: string) {
	return z.boolean({ error: `${capitalise(label)} is true or false.` });
}

/** A list, with the fewest and most entries it may hold. */
export function list<T extends z.ZodType>(
	label: string,
	item: T,
	{ min = 0, max }: { min?: number; max: number }
) {
	let schema = z.array(item, { error: `Give ${label} as a list.` });
	if (min > 0) {
		schema = schema.min(min, {
			error: min === 1 ? `Give at least one ${label}.` : `Give at least ${min} ${label}.`
		});
	}
	return schema.max(max, { error: `Give at most ${figure(max)} ${label}.` });
}

/** The words for issues that no labelled value owns (set below as zod's error map for every parse). */
export function fallbackMessage(issue: z.core.$ZodRawIssue): string {
	const where = issue.path?.length ? `"${String(issue.path[issue.path.length - 1])}"` : 'This';
	switch (issue.code) {
		case 'unrecognized_keys':
			return `Unknown ${issue.keys.length === 1 ? 'key' : 'keys'} ${issue.keys
				.map((k) => `"${k}"`)
				.join(', ')}: check the spelling against the plan format.`;
		case 'invalid_type':
			return issue.input === undefined
				? `${where} is missing.`
				: `${where} should be ${article(issue.expected)}.`;
		case 'invalid_union':
			return 'options' in issue && Array.isArray(issue.options)
				? `${where} is one of: ${issue.options.map((o) => `"${String(o)}"`).join(', ')}.`
				: `${where} does not match any allowed form.`;
		case 'invalid_value':
			return `${where} is one of: ${issue.values.map((v) => JSON.stringify(v)).join(', ')}.`;
		default:
			return `${where} is not an allowed value.`;
	}
}

const kindWords = new Map([
	['object', 'an object { … }'],
	['array', 'a list [ … ]'],
	['string', 'text'],
	['number', 'a number'],
	['boolean', 'true or false']
]);

function article(expected: string): string {
	return kindWords.get(expected) ?? expected;
}

// Every schema imports this module, so no parse anywhere falls back to zod's own English.
z.config({ customError: fallbackMessage });
