/**
 * Engine speed and memory: `npm run bench`. Evaluates a generated 100-field, 5-year plan that uses
 * every demo rotation, many times, and reports the median time per evaluation and the peak memory.
 * Exits 1 when a target is missed: under 5 ms per evaluation of a validated plan, under 4 ms for the
 * partial budget of two evaluated plans (a reference whose fields mostly grow another crop, so most lines
 * are gross), under 20 ms with validation. Evaluating both plans and their budget together is reported
 * beside them, without a target of its own: it is two evaluations and a budget. It also reports the size
 * of the results answer for the plan, the summary the plan editor fetches (under 100 KB) beside the full
 * answer with every field-year (no target). Then, in Chromium on the demo farm's reference plan, the time
 * from a changed rotation to new numbers on screen: median of 20 edits under 150 ms, with the slowest
 * beside it (scripts/bench-editor.ts; `npm run bench` sets up the database and the build it needs).
 * Between the two, the optimiser on generated farms, HiGHS beside glpsol (scripts/bench-optimiser.ts),
 * after the Monte Carlo: 10,000 draws of the demo farm's plan, under 10 s (scripts/bench-monte-carlo.ts).
 */
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { evaluatePlan, summarisePlan } from '../src/lib/engine';
import { nonFiniteNumberPaths } from '../src/lib/engine/finite';
import { partialBudget, yearItems } from '../src/lib/engine/partial-budget';
import { parsePlanDocument, type PlanDocument } from '../src/lib/schemas/plan-file';
import { editorTimings, type EditorTimings } from './bench-editor';
import { monteCarloTargetMs, monteCarloTimings } from './bench-monte-carlo';
import { optimiserTimings, type OptimiserBench } from './bench-optimiser';

const fieldCount = 100;
const runs = 300;
const warmUpRuns = 30;
const targetsMs = { evaluate: 5, partialBudget: 4, parseAndEvaluate: 20 };
const targetsKb = { summary: 100 };
const targetEditMs = 150;

type PlanJson = {
	fields: Record<string, unknown>[];
	practices: { id: string }[];
	rotations: { id: string }[];
	plan: { name: string; fieldRotations: unknown[] };
};

function readScenario(name: string): PlanJson {
	return JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8'));
}

/** The demo farm's practices and rotations on 100 generated fields (sizes from a fixed sequence). */
function generatedPlan(): PlanJson {
	const scenarios = ['reference', 'wide-row-interseeded', 'small-grain-peas', 'reduced-n'].map(
		readScenario
	);
	const doc = structuredClone(scenarios[2]);
	const byId = <T extends { id: string }>(lists: T[][]) => [
		...new Map(lists.flat().map((item) => [item.id, item])).values()
	];
	doc.practices = byId(scenarios.map((s) => s.practices));
	doc.rotations = byId(scenarios.map((s) => s.rotations));
	const rotationLengths = doc.rotations.map(
		(r) => (r as unknown as { practices: string[] }).practices.length
	);
	doc.fields = [];
	doc.plan.fieldRotations = [];
	for (let i = 0; i < fieldCount; i++) {
		const id = `field-${i + 1}`;
		doc.fields.push({
			id,
			name: `Field ${i + 1}`,
			acres: 10 + ((i * 37) % 71),
			productivityIndex: 0.85 + ((i * 13) % 31) / 100
		});
		const rotation = i % doc.rotations.length;
		doc.plan.fieldRotations.push({
			fieldId: id,
			rotationId: doc.rotations[rotation].id,
			startingPhase: 1 + (i % rotationLengths[rotation])
		});
	}
	doc.plan.name = 'Bench: 100 fields';
	return doc;
}

function rotationLengthById(doc: PlanJson): Map<string, number> {
	return new Map(
		doc.rotations.map((r) => [r.id, (r as unknown as { practices: string[] }).practices.length])
	);
}

function validated(json: unknown): PlanDocument {
	const parsed = parsePlanDocument(json);
	if (!parsed.ok) throw new Error(`generated plan is invalid: ${JSON.stringify(parsed.issues)}`);
	return parsed.plan;
}

let peakHeapBytes = 0;

function median(times: number[]): number {
	const sorted = [...times].sort((a, b) => a - b);
	const middle = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

function medianMs(work: () => unknown): number {
	for (let i = 0; i < warmUpRuns; i++) work();
	const times: number[] = [];
	for (let i = 0; i < runs; i++) {
		const start = performance.now();
		work();
		times.push(performance.now() - start);
		if (i % 25 === 0) peakHeapBytes = Math.max(peakHeapBytes, process.memoryUsage().heapUsed);
	}
	return median(times);
}

const json = generatedPlan();
const plan = validated(json);
// Each field one phase on in its rotation: most fields change crop, so their lines are gross.
const referenceJson = structuredClone(json);
referenceJson.plan.name = 'Bench reference';
referenceJson.plan.fieldRotations = (
	referenceJson.plan.fieldRotations as { rotationId: string; startingPhase: number }[]
).map((a) => {
	const length = rotationLengthById(json).get(a.rotationId)!;
	return { ...a, startingPhase: (a.startingPhase % length) + 1 };
});
const referenceFor100 = validated(referenceJson);
const fieldYears = evaluatePlan(plan).fieldYears.length;
const budgeted = evaluatePlan(plan, referenceFor100);

/** Each year's budget items of an evaluated plan, as the engine compares them. */
function itemsByYear(doc: PlanDocument) {
	const result = evaluatePlan(doc);
	return result.farmYears.map((farmYear) => ({
		year: farmYear.year,
		items: yearItems(
			result.fieldYears.filter((fy) => fy.year === farmYear.year),
			farmYear
		)
	}));
}
const planItems = itemsByYear(plan);
const referenceItems = new Map(itemsByYear(referenceFor100).map((y) => [y.year, y.items]));
const acres = budgeted.plan.acres;

const rows = [
	{
		what: 'evaluate (validated plan)',
		ms: medianMs(() => evaluatePlan(plan)),
		target: targetsMs.evaluate
	},
	{
		what: 'partial budget (+ check)',
		ms: medianMs(() =>
			nonFiniteNumberPaths(partialBudget('Bench reference', acres, planItems, referenceItems))
		),
		target: targetsMs.partialBudget
	},
	{
		what: 'both plans + budget',
		ms: medianMs(() => evaluatePlan(plan, referenceFor100)),
		target: null
	},
	{
		what: '  of which: finite check',
		ms: medianMs(() => nonFiniteNumberPaths(budgeted)),
		target: null
	},
	{
		what: 'validate + evaluate',
		ms: medianMs(() => evaluatePlan(validated(json))),
		target: targetsMs.parseAndEvaluate
	}
];

// The answers' JSON as the results route sends them (characters; the JSON is ASCII but for names).
const evaluated = evaluatePlan(plan);
const sizes = [
	{ what: 'full answer (detail=full)', kb: JSON.stringify(evaluated).length / 1024, target: null },
	{
		what: 'summary answer',
		kb: JSON.stringify(summarisePlan(evaluated)).length / 1024,
		target: targetsKb.summary
	}
];

const maxRssMb = process.resourceUsage().maxRSS / 1024;
const peakHeapMb = Math.max(peakHeapBytes, process.memoryUsage().heapUsed) / 1024 / 1024;

const pad = (s: string, n: number) => s.padEnd(n);
const num = (x: number, digits: number) => x.toFixed(digits).padStart(9);
let missed = false;
type Row = { what: string; ms: number; target: number | null };
function printTimes(rows: Row[], column = 'median ms') {
	console.log(`${pad('measure', 28)}${column.padStart(9)}  ${'target'.padStart(8)}  result`);
	for (const row of rows) {
		const ok = row.target === null || row.ms < row.target;
		missed ||= !ok;
		const target = row.target === null ? '-' : `< ${row.target}`;
		console.log(
			`${pad(row.what, 28)}${num(row.ms, 3)}  ${target.padStart(8)}  ${ok ? 'ok' : 'OVER'}`
		);
	}
}

console.log(
	`Plan: ${fieldCount} fields × 5 years = ${fieldYears} field-years; median of ${runs} runs`
);
printTimes(rows);
console.log(`${pad('answer size', 28)}${'KB'.padStart(9)}  ${'target'.padStart(8)}  result`);
for (const row of sizes) {
	const ok = row.target === null || row.kb < row.target;
	missed ||= !ok;
	const target = row.target === null ? '-' : `< ${row.target} KB`;
	console.log(
		`${pad(row.what, 28)}${num(row.kb, 1)}  ${target.padStart(8)}  ${ok ? 'ok' : 'OVER'}`
	);
}
console.log(`${pad('peak RSS (maxRSS)', 28)}${num(maxRssMb, 1)}  ${'MB'.padStart(8)}`);
console.log(`${pad('peak JS heap (sampled)', 28)}${num(peakHeapMb, 1)}  ${'MB'.padStart(8)}`);

{
	const mc = monteCarloTimings();
	console.log(
		`\nMonte Carlo: ${mc.draws.toLocaleString('en-US')} draws of "${mc.planName}" and ` +
			`"${mc.referenceName}" on the same draws (share beating the reference: ${mc.beatsReferenceProbability})`
	);
	const rows = [
		{ what: 'draws: median of runs', ms: median(mc.runMs), target: monteCarloTargetMs },
		{ what: 'draws: slowest run', ms: Math.max(...mc.runMs), target: null }
	];
	printTimes(rows, 'ms');
}

let optimiser: OptimiserBench | undefined;
try {
	optimiser = await optimiserTimings();
} catch (error) {
	console.log(`\nOptimiser: not measured: ${error instanceof Error ? error.message : error}`);
	missed = true;
}
if (optimiser) {
	console.log('\nOptimiser on generated farms (5 years; tests/support/generated-farm.ts)');
	for (const s of optimiser.sizes) {
		console.log(
			`  ${s.what}: ${s.columns} columns, ${s.rows} rows, ${s.nonZeros} non-zeros; ` +
				`peak RSS by the end of it ${s.peakRssMb.toFixed(0)} MB`
		);
	}
	console.log(
		`${pad('measure', 30)}${'median ms'.padStart(10)}${'cpu ms'.padStart(10)}${'runs'.padStart(6)}  ` +
			`${'target'.padStart(8)}  result`
	);
	for (const t of optimiser.timings) {
		const ok = t.target === null || t.ms < t.target;
		missed ||= !ok;
		console.log(
			`${pad(t.what, 30)}${t.ms.toFixed(1).padStart(10)}${t.cpuMs.toFixed(1).padStart(10)}` +
				`${String(t.runs).padStart(6)}  ${(t.target === null ? '-' : `< ${t.target}`).padStart(8)}  ` +
				(t.target === null ? '' : ok ? 'PASS' : 'FAIL')
		);
	}
	const money = (x: number | null | undefined) =>
		(x === null || x === undefined ? 'none' : x.toFixed(2)).padStart(16);
	console.log(
		`${pad('objective ($)', 30)}${'HiGHS'.padStart(16)}${'glpsol'.padStart(16)}  rel. diff`
	);
	for (const o of optimiser.objectives) {
		const diff =
			o.highs !== null && o.glpsol !== null
				? (Math.abs(o.highs - o.glpsol) / Math.abs(o.glpsol)).toExponential(1)
				: '-';
		console.log(`${pad(o.what, 30)}${money(o.highs)}${money(o.glpsol)}  ${diff.padStart(9)}`);
	}
	for (const note of optimiser.notes) console.log(`  ${note}`);
	console.log(
		`${pad('peak RSS (maxRSS, whole run)', 30)}${(process.resourceUsage().maxRSS / 1024).toFixed(1).padStart(10)} MB`
	);
}

let editor: EditorTimings | undefined;
try {
	editor = await editorTimings();
} catch (error) {
	console.log(`\nPlan editor: not measured: ${error instanceof Error ? error.message : error}`);
	missed = true;
}
if (editor) {
	const { editMs } = editor;
	console.log(
		`\nPlan editor in Chromium, demo reference plan (${editor.fieldCount} fields × ` +
			`${editor.yearCount} years): from a changed rotation to new numbers on screen, ` +
			`${editor.fieldName} changed ${editMs.length} times`
	);
	printTimes(
		[
			{ what: 'to new numbers: median', ms: median(editMs), target: targetEditMs },
			{ what: 'to new numbers: slowest', ms: Math.max(...editMs), target: null }
		],
		'ms'
	);
}
if (missed) process.exitCode = 1;
