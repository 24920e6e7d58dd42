/**
 * The Monte Carlo for `npm run bench`: 10,000 draws of the demo farm's wide-row plan against its
 * reference plan (the scenario files the demo is seeded from), both plans on the same draws, as the
 * job runs them: each plan reduced to its coefficients by one evaluation, then the draws in steps.
 * Target: under 10 s. Median of five runs, the slowest beside it.
 */
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { createMonteCarlo, defaultComovement, riskModel } from '../src/lib/engine/risk/monte-carlo';
import { parsePlanDocument, type PlanDocument } from '../src/lib/schemas/plan-file';

export const monteCarloTargetMs = 10_000;
const draws = 10_000;
const runs = 5;

export interface MonteCarloBench {
	draws: number;
	planName: string;
	referenceName: string;
	runMs: number[];
	beatsReferenceProbability: number | null;
}

function scenario(name: string): PlanDocument {
	const parsed = parsePlanDocument(JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8')));
	if (!parsed.ok) throw new Error(`scenarios/${name}.json is not a valid plan file`);
	return parsed.plan;
}

export function monteCarloTimings(): MonteCarloBench {
	const planDocument = scenario('wide-row-interseeded');
	const referenceDocument = scenario('reference');
	const runMs: number[] = [];
	let beats: number | null = null;
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		const run = createMonteCarlo(riskModel(planDocument), riskModel(referenceDocument), {
			draws,
			seed: 2027 + i,
			crops: [],
			...defaultComovement
		});
		while (run.done < run.total) run.step(500);
		beats = run.result().beatsReferenceProbability;
		runMs.push(performance.now() - start);
	}
	return {
		draws,
		planName: planDocument.plan.name,
		referenceName: referenceDocument.plan.name,
		runMs,
		beatsReferenceProbability: beats
	};
}
