import { z } from 'zod';
import { planDocumentSchema } from './plan-file';

/**
 * The plan file's JSON Schema, generated from the zod schema so the two cannot disagree. It describes
 * what a file may contain (defaults are optional); cross-references (ids, phases, price years) are
 * checked by `parsePlanDocument`, not by the JSON Schema.
 */
export function planFileJsonSchema(): Record<string, unknown> {
	const generated = z.toJSONSchema(planDocumentSchema, { io: 'input', target: 'draft-2020-12' });
	return {
		...generated,
		title: 'Furrowcast plan file',
		description:
			'One farm, its fields, herd, field operations, crop practices, rotations, price sets and one plan. US customary units; formatVersion 2 (format 1 files are read too).'
	};
}

/** The text committed as docs/plan-file.schema.json. */
export function planFileJsonSchemaText(): string {
	return JSON.stringify(planFileJsonSchema(), null, '\t') + '\n';
}
