import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';
import { planFileJsonSchemaText } from '../../src/lib/schemas/plan-json-schema';

describe('plan format documents', () => {
	it('the committed JSON Schema is what scripts/plan-schema.ts generates', () => {
		// Regenerate with: npx tsx scripts/plan-schema.ts
		expect(readFileSync('docs/plan-file.schema.json', 'utf8')).toBe(planFileJsonSchemaText());
	});

	it('the JSON Schema states defaults and refuses unknown keys', () => {
		const schema = JSON.parse(planFileJsonSchemaText());
		expect(schema.properties.formatVersion.const).toBe(2);
		expect(schema.additionalProperties).toBe(false);
		// SRM glossary default intake, 26 lb DM per AU-day
		expect(schema.properties.herd.anyOf[0].properties.intakeLbDmPerAuDay.default).toBe(26);
		expect(schema.required).toEqual(
			expect.arrayContaining([
				'formatVersion',
				'farm',
				'fields',
				'practices',
				'rotations',
				'priceSets',
				'plan'
			])
		);
	});

	it('the example in docs/plan-format.md is a valid plan that evaluates', () => {
		const markdown = readFileSync('docs/plan-format.md', 'utf8');
		const example = /```json\n([\s\S]*?)\n```/.exec(markdown)?.[1];
		const parsed = parsePlanDocument(JSON.parse(example ?? 'null'));
		expect(parsed.ok).toBe(true);
		if (!parsed.ok) return;
		const result = evaluatePlan(parsed.plan);
		expect(result.farmYears.map((y) => y.year)).toEqual([2027, 2028]);
		expect(result.farmYears[0].grazingAuDays).toBeGreaterThan(0);
	});
});
