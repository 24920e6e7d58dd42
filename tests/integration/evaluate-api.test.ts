import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../support/http';
import { runPlan } from '../support/plan-cli';
import { demoUsers } from '../support/server';
import { farmYearNames, partialBudgetNames } from '../support/result-contract';

const scenario = (name: string) => JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));
let lender: Client;
beforeAll(async () => {
	lender = await signedIn(demoUsers.lender);
});

describe('POST /api/v1/evaluate', () => {
	it.each(['reference', 'wide-row-interseeded', 'small-grain-peas', 'reduced-n'])(
		'answers the results of scenarios/%s.json',
		async (name) => {
			const response = await lender.json('/api/v1/evaluate', 'POST', scenario(name));
			expect(response.status).toBe(200);
			const result = await response.json();
			expect(result.farmYears).toHaveLength(result.plan.years);
			for (const farmYear of result.farmYears) {
				for (const key of farmYearNames) expect(farmYear).toHaveProperty(key);
				expect(farmYear.labourHoursByMonth).toHaveLength(12);
			}
			expect(result.partialBudget).toBeUndefined();
		}
	);

	it('adds the partial budget against a reference plan, the same JSON the command line prints', async () => {
		const response = await lender.json('/api/v1/evaluate', 'POST', {
			document: scenario('reduced-n'),
			against: scenario('reference')
		});
		expect(response.status).toBe(200);
		const result = await response.json();
		for (const part of [...result.partialBudget.years, result.partialBudget.average]) {
			for (const key of partialBudgetNames) expect(typeof part[key]).toBe('number');
		}
		const cli = await runPlan(
			'evaluate',
			'scenarios/reduced-n.json',
			'--against',
			'scenarios/reference.json'
		);
		expect(cli.code).toBe(0);
		expect(result).toEqual(JSON.parse(cli.stdout));
	});

	it('answers 422 naming the path of each bad value', async () => {
		const doc = scenario('reference');
		doc.fields[0].acres = -3;
		doc.plan.fieldRotations[1].rotationId = 'no-such-rotation';
		const response = await lender.json('/api/v1/evaluate', 'POST', doc);
		expect(response.status).toBe(422);
		const { issues } = await response.json();
		const paths = issues.map((i: { path: string }) => i.path);
		expect(paths).toContain('fields.0.acres');
		expect(paths).toContain('plan.fieldRotations.1.rotationId');
	});

	it('prefixes paths with document. or against. when both are sent', async () => {
		const reference = scenario('reference');
		delete reference.farm;
		const response = await lender.json('/api/v1/evaluate', 'POST', {
			document: scenario('reduced-n'),
			against: reference
		});
		expect(response.status).toBe(422);
		const { issues } = await response.json();
		expect(issues.map((i: { path: string }) => i.path)).toEqual(['against.farm']);
	});

	it('refuses a body that is not JSON (400) and anyone not signed in (401)', async () => {
		expect((await lender.json('/api/v1/evaluate', 'POST', '{ not json')).status).toBe(400);
		expect(
			(await new Client().json('/api/v1/evaluate', 'POST', scenario('reference'))).status
		).toBe(401);
	});
});
