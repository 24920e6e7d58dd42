import { readFileSync } from 'node:fs';
import type { Component } from 'svelte';
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import DieselChart from '../../src/lib/components/plan-results/DieselChart.svelte';
import FarmYearTable from '../../src/lib/components/plan-results/FarmYearTable.svelte';
import ForageChart from '../../src/lib/components/plan-results/ForageChart.svelte';
import LabourChart from '../../src/lib/components/plan-results/LabourChart.svelte';
import NetReturnChart from '../../src/lib/components/plan-results/NetReturnChart.svelte';
import NitrogenChart from '../../src/lib/components/plan-results/NitrogenChart.svelte';
import { usResultUnits } from '../../src/lib/components/plan-results/result-units';
import { shownScales } from '../../src/lib/server/display-units';
import { farmYearTableRows } from '../../src/lib/csv-export';
import {
	evaluatePlan,
	summarisePlan,
	type FarmYearSummary,
	type PlanResult
} from '../../src/lib/engine';
import { formatNumber } from '../../src/lib/format';
import { MONTH_ABBREVIATIONS, MONTH_NAMES } from '../../src/lib/months';
import { parsePlanDocument } from '../../src/lib/schemas/plan-file';

type Doc = Record<string, unknown> & { farm: { labourHoursAvailableByMonth: number[] } };

function plan(name: string, edit: (doc: Doc) => void = () => {}) {
	const doc = JSON.parse(readFileSync(`scenarios/${name}.json`, 'utf8')) as Doc;
	edit(doc);
	const parsed = parsePlanDocument(doc);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	return parsed.plan;
}

// `summarisePlan` gives each farm-year its cost groups and N ledger, though `PlanSummary` still types
// `farmYears` as the engine's `FarmYearResult[]` (src/lib/engine/plan-summary.ts).
const summaryOf = (result: PlanResult) => ({
	farmYears: summarisePlan(result).farmYears as FarmYearSummary[]
});
const summary = (name: string, edit?: (doc: Doc) => void) =>
	summaryOf(evaluatePlan(plan(name, edit)));

// Half the crop prices: the demo farm's fixed costs turn its years to losses.
const halfPrices = (doc: Doc) => {
	for (const set of doc.priceSets as { cropPricesUsdPerUnit: Record<string, number> }[]) {
		for (const crop of Object.keys(set.cropPricesUsdPerUnit)) set.cropPricesUsdPerUnit[crop] /= 2;
	}
};

/** Server-rendered HTML without Svelte's hydration comments, entities decoded. */
function html<Props extends Record<string, unknown>>(component: Component<Props>, props: Props) {
	return render(component, { props })
		.body.replace(/<!--[\s\S]*?-->/g, '')
		.replace(/&quot;/g, '"')
		.replace(/&#39;/g, "'")
		.replace(/&amp;/g, '&');
}

const text = (cell: string) => cell.replace(/<[^>]*>/g, '').trim();
const ariaLabel = (page: string) => page.match(/role="img" aria-label="([^"]*)"/)![1];
const caption = (page: string) => text(page.match(/<figcaption[^>]*>([\s\S]*?)<\/figcaption>/)![1]);

/** Each body row of the first table inside `<details>`: its row header and its cells' text. */
function detailRows(page: string): { label: string; cells: string[] }[] {
	const table = page.match(/<details[\s\S]*?<tbody[^>]*>([\s\S]*?)<\/tbody>/)![1];
	return [...table.matchAll(/<tr[^>]*>([\s\S]*?)<\/tr>/g)].map(([, row]) => ({
		label: text(row.match(/<th scope="row"[^>]*>([\s\S]*?)<\/th>/)![1]),
		cells: [...row.matchAll(/<td[^>]*>([\s\S]*?)<\/td>/g)].map(([, c]) => text(c))
	}));
}

const detailColumns = (page: string) =>
	[
		...page
			.match(/<details[\s\S]*?<thead>([\s\S]*?)<\/thead>/)![1]
			.matchAll(/<th scope="col"[^>]*>([\s\S]*?)<\/th>/g)
	].map(([, c]) => text(c));

const figure = (s: string) => Number(s.replace(/,/g, ''));

// Exact by definition (NIST Handbook 44, Appendix C): 1 lb = 0.453 592 37 kg; 1 US gal = 231 in³
// = 3.785 411 784 L; 1 acre = 43,560 ft² = 4,046.856 422 4 m² = 0.404 685 642 24 ha.
const kgPerLb = 0.45359237;
const litresPerGallon = 3.785411784;
const hectaresPerAcre = 0.40468564224;

const reference = summary('reference');
const wide = summaryOf(evaluatePlan(plan('wide-row-interseeded'), plan('reference')));
const years = reference.farmYears.map((y) => y.year);

describe('the whole-farm table', () => {
	const page = html(FarmYearTable, { farmYears: reference.farmYears });
	const rowCells = (key: string) => {
		const row = page.match(new RegExp(`<tr data-row="${key}"[^>]*>([\\s\\S]*?)</tr>`))![1];
		return {
			label: text(row.match(/<th scope="row"[^>]*>([\s\S]*?)<\/th>/)![1]),
			cells: [...row.matchAll(/<td[^>]*>([\s\S]*?)<\/td>/g)].map(([, c]) => text(c))
		};
	};

	it('has a column per year and shows every line of the exported rows', () => {
		// The demo plans run five years from 2027 (scenarios/*.json).
		const heads = [...page.matchAll(/<th scope="col"[^>]*>([\s\S]*?)<\/th>/g)].map(([, c]) =>
			text(c)
		);
		expect(heads).toEqual(['Whole farm', '2027', '2028', '2029', '2030', '2031']);
		const rows = farmYearTableRows(reference.farmYears);
		expect(rows.map((r) => r.key)).toEqual(
			[...page.matchAll(/<tr data-row="([^"]+)"/g)].map(([, key]) => key)
		);
		for (const row of rows) {
			const shown = rowCells(row.key);
			expect(shown.label).toBe(row.label);
			expect(shown.cells).toEqual(row.values.map((v) => formatNumber(v, row.digits)));
		}
		expect(page).toContain('scope="rowgroup"');
	});

	it('adds up as a budget does', () => {
		// Whole-farm budget identity (common practice, no published source): the cost groups sum to the
		// total costs, and revenue less total costs is the net return; 480 acres (scenarios.test.ts).
		const groups = [
			'directUsd',
			'machineryUsd',
			'fieldLabourUsd',
			'cashRentUsd',
			'hayUsd',
			'choreLabourUsd',
			'fixedUsd'
		].map((key) => rowCells(key).cells.map(figure));
		const revenue = rowCells('revenue').cells.map(figure);
		const costs = rowCells('costs').cells.map(figure);
		const net = rowCells('netReturn').cells.map(figure);
		const perAcre = rowCells('netReturnPerArea').cells.map(figure);
		for (const [y] of years.entries()) {
			// Each shown figure is rounded to the dollar: seven of them can be off by 3.5 together.
			expect(Math.abs(groups.reduce((sum, g) => sum + g[y], 0) - costs[y])).toBeLessThanOrEqual(
				3.5
			);
			expect(Math.abs(revenue[y] - costs[y] - net[y])).toBeLessThanOrEqual(1);
			expect(Math.abs(perAcre[y] * 480 - net[y])).toBeLessThanOrEqual(0.005 * 480 + 0.5);
		}
	});

	it('shows the reference plan feeding hay all winter, with no hay saved by grazing', () => {
		// SRM: 60 cows × 1,350 lb = 81 AU; the reference plan grazes nothing (scenarios.test.ts).
		expect(rowCells('hayBalesAvoided').cells).toEqual(years.map(() => '0'));
		expect(rowCells('hayUsdAvoided').cells).toEqual(years.map(() => '0'));
		for (const cell of rowCells('hayBales').cells) expect(figure(cell)).toBeGreaterThan(0);
	});

	it('marks a loss in red as well as by its sign', () => {
		const loss = html(FarmYearTable, { farmYears: summary('reference', halfPrices).farmYears });
		const row = loss.match(/<tr data-row="netReturn"[^>]*>([\s\S]*?)<\/tr>/)![1];
		const cells = [...row.matchAll(/<td class="([^"]*)"[^>]*>([\s\S]*?)<\/td>/g)];
		expect(cells).toHaveLength(5);
		for (const [, cls, value] of cells) {
			expect(text(value)).toMatch(/^-\d/);
			expect(cls).toContain('text-loss-700');
		}
		expect(page.match(/<tr data-row="netReturn"[^>]*>([\s\S]*?)<\/tr>/)![1]).not.toContain(
			'text-loss-700'
		);
	});

	it('shows N, diesel and per-area figures in metric units on a metric farm', () => {
		const units = shownScales('metric');
		const us = farmYearTableRows(reference.farmYears);
		const metric = farmYearTableRows(reference.farmYears, units);
		const byKey = (rows: typeof us, key: string) => rows.find((r) => r.key === key)!;
		expect(byKey(metric, 'nitrogenBought').label).toBe('N bought (kg N)');
		expect(byKey(metric, 'diesel').label).toBe('Diesel (L)');
		expect(byKey(metric, 'netReturnPerArea').label).toBe('Net return ($/ha)');
		for (const [y] of years.entries()) {
			const at = (rows: typeof us, key: string) => byKey(rows, key).values[y]!;
			expect(at(metric, 'nitrogenBought')).toBeCloseTo(at(us, 'nitrogenBought') * kgPerLb, 6);
			expect(at(metric, 'diesel')).toBeCloseTo(at(us, 'diesel') * litresPerGallon, 6);
			expect(at(metric, 'netReturnPerArea')).toBeCloseTo(
				at(us, 'netReturnPerArea') / hectaresPerAcre,
				6
			);
			expect(at(metric, 'revenue')).toBe(at(us, 'revenue'));
		}
		const shown = html(FarmYearTable, { farmYears: reference.farmYears, units });
		expect(shown).toContain('N bought (kg N)');
		expect(shown).toContain(formatNumber(byKey(metric, 'diesel').values[0], 0));
	});

	it('takes US customary units by default, the same the server gives a US farm', () => {
		expect(shownScales('us')).toMatchObject(usResultUnits);
	});
});

const netReturnSeries = [
	{ label: 'This plan', values: wide.farmYears.map((y) => y.netReturnUsd) },
	{ label: 'Reference plan', values: reference.farmYears.map((y) => y.netReturnUsd) }
];

describe('every chart', () => {
	const charts: [string, string][] = [
		['net return', html(NetReturnChart, { years, series: netReturnSeries })],
		['labour', html(LabourChart, { farmYear: wide.farmYears[0] })],
		['nitrogen', html(NitrogenChart, { farmYears: wide.farmYears })],
		['forage', html(ForageChart, { farmYears: wide.farmYears })],
		[
			'diesel',
			html(DieselChart, {
				years,
				series: [{ label: 'This plan', values: wide.farmYears.map((y) => y.dieselGallons) }]
			})
		]
	];

	it.each(charts)(
		'%s: a figure with a caption, a spoken summary, a worded legend and the table behind it',
		(_, page) => {
			expect(page).toMatch(/^<figure[\s\S]*<\/figure>$/);
			expect(caption(page).length).toBeGreaterThan(40);
			expect(ariaLabel(page)).toMatch(/\d/);
			const legend = [...page.matchAll(/<li[^>]*>([\s\S]*?)<\/li>/g)].map(([, c]) => text(c));
			expect(legend.length).toBeGreaterThan(0);
			for (const word of legend) expect(word).toMatch(/[a-z]{3}/i);
			expect(page).toMatch(/<details[^>]*><summary[^>]*>\s*Show the table\s*<\/summary>/);
			expect(detailColumns(page).length).toBeGreaterThan(1);
			expect(detailRows(page).length).toBeGreaterThan(0);
		}
	);
});

describe('the net return chart', () => {
	it('sets this plan beside the reference plan, in words and in its table', () => {
		const page = html(NetReturnChart, { years, series: netReturnSeries });
		expect(caption(page)).toContain('left to right: This plan, Reference plan');
		expect(caption(page)).toContain('Bars below the zero line are years that lose money.');
		const spoken = ariaLabel(page);
		for (const s of netReturnSeries) {
			const values = s.values.map((v, i) => `${years[i]} $${formatNumber(v)}`).join('; ');
			expect(spoken).toContain(`${s.label}: ${values}.`);
		}
		expect(detailColumns(page)).toEqual(['Year', 'This plan ($)', 'Reference plan ($)']);
		expect(detailRows(page)).toEqual(
			years.map((year, i) => ({
				label: String(year),
				cells: netReturnSeries.map((s) => formatNumber(s.values[i]))
			}))
		);
	});

	it('says "minus" for a loss and marks it in the table', () => {
		const loss = summary('reference', halfPrices).farmYears.map((y) => y.netReturnUsd);
		const page = html(NetReturnChart, { years, series: [{ label: 'Half prices', values: loss }] });
		expect(ariaLabel(page)).toContain(`${years[0]} minus $${formatNumber(-loss[0])}`);
		expect(page).toMatch(/<td class="[^"]*text-loss-700[^"]*">\s*-/);
	});
});

describe('the labour chart', () => {
	it('names the months the family is short of hours, and only those', () => {
		// A family with 30 hours a month: the months worked past 30 h are short (invented availability).
		const tight = summary('wide-row-interseeded', (doc) => {
			doc.farm.labourHoursAvailableByMonth = new Array(12).fill(30);
		}).farmYears[0];
		const short = tight.labourHoursByMonth.flatMap((hours, m) =>
			hours > 30 ? [`${MONTH_NAMES[m]} by ${formatNumber(hours - 30)} h`] : []
		);
		expect(short.length).toBeGreaterThan(0);
		expect(short.length).toBeLessThan(12);
		const page = html(LabourChart, { farmYear: tight });
		expect(ariaLabel(page)).toContain(`Short of hours in ${short.join(', ')}.`);
		expect(caption(page)).toContain('Bars above the line are months the family is short of hours.');
	});

	it('says when the family has the hours every month', () => {
		const year = reference.farmYears[0];
		expect(year.labourHoursByMonth.every((h, m) => h <= year.labourHoursAvailableByMonth[m])).toBe(
			true
		);
		expect(ariaLabel(html(LabourChart, { farmYear: year }))).toContain(
			'The family has the hours every month.'
		);
	});

	it('tables each month: field work and chores make the total, beside the hours the family has', () => {
		const year = wide.farmYears[0];
		const page = html(LabourChart, { farmYear: year });
		const rows = detailRows(page);
		expect(rows.map((r) => r.label)).toEqual([...MONTH_ABBREVIATIONS]);
		for (const [m, row] of rows.entries()) {
			const [field, chores, total, has] = row.cells.map(figure);
			expect(Math.abs(field + chores - total)).toBeLessThanOrEqual(1);
			expect(has).toBe(year.labourHoursAvailableByMonth[m]);
		}
		// The reference farm's family has 200 hours in January (scenarios/reference.json).
		expect(ariaLabel(page)).toContain(`Jan ${formatNumber(year.labourHoursByMonth[0])} of 200`);
	});
});

describe('the nitrogen chart', () => {
	it('tables need, each credit and the N bought, the bought N as the whole-farm table has it', () => {
		const reducedN = summary('reduced-n');
		const page = html(NitrogenChart, { farmYears: reducedN.farmYears });
		expect(detailColumns(page)).toEqual([
			'Year',
			'Need (lb N)',
			'Prior crop credit (lb N)',
			'Cover crop credit (lb N)',
			'Grazing manure credit (lb N)',
			'N bought (lb N)'
		]);
		const bought = farmYearTableRows(reducedN.farmYears).find((r) => r.key === 'nitrogenBought')!;
		const rows = detailRows(page);
		expect(rows.map((r) => r.cells[4])).toEqual(bought.values.map((v) => formatNumber(v)));
		// The reduced-N plan's rye after soybeans leaves a cover credit (scenarios.test.ts).
		expect(rows.some((r) => figure(r.cells[2]) > 0)).toBe(true);
	});

	it('shows kg N on a metric farm', () => {
		const units = shownScales('metric');
		const page = html(NitrogenChart, { farmYears: reference.farmYears, units });
		expect(detailColumns(page)[1]).toBe('Need (kg N)');
		const needLb = reference.farmYears[0].nitrogen.needLb;
		expect(detailRows(page)[0].cells[0]).toBe(formatNumber(needLb * kgPerLb));
	});
});

describe('the forage chart', () => {
	it('shows the reference herd fed all winter on hay', () => {
		// SRM: 60 cows × 1,350 lb ÷ 1,000 = 81 AU; × 180 days = 14,580 AU-days, none of it grazed.
		const page = html(ForageChart, { farmYears: reference.farmYears });
		for (const row of detailRows(page)) {
			expect(row.cells.slice(0, 3)).toEqual(['14,580', '0', '14,580']);
			expect(figure(row.cells[3])).toBeGreaterThan(0);
		}
		expect(ariaLabel(page)).toContain('2027 need 14,580, grazed 0, hay 14,580');
	});

	it('fills what grazing leaves with hay in the wide-row plan', () => {
		const page = html(ForageChart, { farmYears: wide.farmYears });
		for (const row of detailRows(page)) {
			const [need, grazed, hay] = row.cells.map(figure);
			expect(grazed).toBeGreaterThan(0);
			expect(Math.abs(grazed + hay - need)).toBeLessThanOrEqual(1);
		}
	});
});

describe('the diesel chart', () => {
	it('shows litres on a metric farm', () => {
		const gallons = wide.farmYears.map((y) => y.dieselGallons);
		const page = html(DieselChart, {
			years,
			series: [{ label: 'This plan', values: gallons }],
			units: shownScales('metric')
		});
		expect(detailColumns(page)).toEqual(['Year', 'This plan (L)']);
		expect(detailRows(page).map((r) => r.cells[0])).toEqual(
			gallons.map((g) => formatNumber(g * litresPerGallon))
		);
		expect(ariaLabel(page)).toContain(`2027 ${formatNumber(gallons[0] * litresPerGallon)} L`);
	});
});
