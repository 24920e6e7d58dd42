import type { FarmYearResult } from './farm-year';
import type { FieldYearResult } from './field-year';

/** One line of a partial budget: an enterprise (a crop's id, `herd` or `farm`) and a category of it. */
export interface BudgetLine {
	enterprise: string;
	category: Category;
	/** What the line says, e.g. "Corn: seed". */
	item: string;
	amountUsd: number;
}

export interface BudgetParts {
	addedReturnsUsd: number;
	reducedCostsUsd: number;
	addedCostsUsd: number;
	reducedReturnsUsd: number;
	netChangeUsd: number;
}

export interface PartialBudgetYear extends BudgetParts {
	year: number;
	perAcre: BudgetParts;
	lines: {
		addedReturns: BudgetLine[];
		reducedCosts: BudgetLine[];
		addedCosts: BudgetLine[];
		reducedReturns: BudgetLine[];
	};
}

export interface PartialBudget {
	referencePlanName: string;
	acres: number;
	years: PartialBudgetYear[];
	/** Each part and line averaged over the years of the horizon. */
	average: Omit<PartialBudgetYear, 'year'>;
}

/** Categories of return and cost, each with the words a line prints. */
const categoryWords = {
	sales: 'sales',
	seed: 'seed',
	nitrogen: 'nitrogen fertiliser',
	'other-fertiliser': 'other fertiliser',
	chemicals: 'chemicals',
	'other-direct': 'drying, hauling, insurance and other',
	'cover-seed': 'cover crop seed',
	'custom-hire': 'custom hire',
	'operating-interest': 'operating interest',
	diesel: 'diesel',
	repairs: 'machinery repairs',
	'field-labour': 'field labour',
	hay: 'purchased hay',
	'chore-labour': 'chore labour',
	'fixed-costs': 'fixed costs'
} as const;
export type Category = keyof typeof categoryWords;
const categoryText = new Map<Category, string>(
	Object.entries(categoryWords) as [Category, string][]
);

/** What one enterprise on one field (or the herd, or the farm) earns and spends in a year. */
interface EnterpriseYear {
	enterprise: string;
	name: string;
	returns: [Category, number][];
	costs: [Category, number][];
}

/** One plan-year, ready to compare: each field's crop, the herd and the farm's fixed costs. */
export interface YearItems {
	fields: Map<string, EnterpriseYear>;
	herd: EnterpriseYear;
	farm: EnterpriseYear;
}

export function yearItems(fieldYears: FieldYearResult[], farmYear: FarmYearResult): YearItems {
	const fields = new Map<string, EnterpriseYear>();
	for (const fy of fieldYears) {
		const d = fy.directCosts;
		const o = fy.operationCosts;
		fields.set(fy.fieldId, {
			enterprise: fy.crop,
			name: fy.cropName,
			returns: [['sales', fy.revenueUsd]],
			costs: [
				['seed', d.seedUsd],
				['nitrogen', d.nitrogenUsd],
				['other-fertiliser', d.otherFertiliserUsd],
				['chemicals', d.chemicalsUsd],
				['other-direct', d.otherDirectUsd],
				['cover-seed', d.coverSeedUsd],
				['custom-hire', d.customHireUsd],
				['operating-interest', d.operatingInterestUsd],
				['diesel', o.fuelUsd],
				['repairs', o.repairsUsd],
				['field-labour', o.labourUsd]
			]
		});
	}
	return {
		fields,
		herd: {
			enterprise: 'herd',
			name: 'Herd',
			returns: [],
			costs: [
				['hay', farmYear.hayCostUsd],
				['chore-labour', farmYear.choreLabourUsd]
			]
		},
		farm: {
			enterprise: 'farm',
			name: 'Whole farm',
			returns: [],
			costs: [['fixed-costs', farmYear.fixedCostsUsd]]
		}
	};
}

// Differences smaller than a hundredth of a cent are rounding, not a change worth a line.
const negligibleUsd = 1e-4;

type PartName = keyof PartialBudgetYear['lines'];

/** Lines of one part, summed by enterprise and category. */
class PartLines {
	private readonly byKey = new Map<string, BudgetLine>();

	add(enterprise: EnterpriseYear, category: Category, amountUsd: number) {
		const key = `${enterprise.enterprise}\u0000${category}`;
		const line = this.byKey.get(key);
		if (line) line.amountUsd += amountUsd;
		else
			this.byKey.set(key, {
				enterprise: enterprise.enterprise,
				category,
				item: `${enterprise.name}: ${categoryText.get(category)}`,
				amountUsd
			});
	}

	lines(): BudgetLine[] {
		return [...this.byKey.values()]
			.filter((line) => line.amountUsd > negligibleUsd)
			.sort((a, b) => b.amountUsd - a.amountUsd);
	}
}

/**
 * The four parts of one year (NDSU, Saxowsky; Purdue, Langemeier: only what changes is listed). A field
 * that changes crop is budgeted gross: the old crop's returns are reduced returns and its costs reduced
 * costs, each in full, and the new crop's are added returns and added costs. Where the same crop keeps
 * its place, and for the herd and the farm, only the net change of each category is listed.
 */
function budgetYearLines(plan: YearItems, reference: YearItems): PartialBudgetYear['lines'] {
	const parts = new Map<PartName, PartLines>([
		['addedReturns', new PartLines()],
		['reducedCosts', new PartLines()],
		['addedCosts', new PartLines()],
		['reducedReturns', new PartLines()]
	]);
	const part = (name: PartName) => parts.get(name)!;
	const gross = (e: EnterpriseYear, returnsPart: PartName, costsPart: PartName) => {
		for (const [category, usd] of e.returns) part(returnsPart).add(e, category, usd);
		for (const [category, usd] of e.costs) part(costsPart).add(e, category, usd);
	};
	const net = (p: EnterpriseYear, r: EnterpriseYear) => {
		const change = (planItems: [Category, number][], refItems: [Category, number][]) =>
			planItems.map(([category, usd], i): [Category, number] => [category, usd - refItems[i][1]]);
		for (const [category, usd] of change(p.returns, r.returns)) {
			if (usd >= 0) part('addedReturns').add(p, category, usd);
			else part('reducedReturns').add(p, category, -usd);
		}
		for (const [category, usd] of change(p.costs, r.costs)) {
			if (usd >= 0) part('addedCosts').add(p, category, usd);
			else part('reducedCosts').add(p, category, -usd);
		}
	};

	// Same-crop changes are netted across fields first, so one field's saving offsets another's cost.
	const sameCrop = new Map<string, { plan: EnterpriseYear; reference: EnterpriseYear }>();
	const copy = (e: EnterpriseYear): EnterpriseYear => ({
		...e,
		returns: e.returns.map(([c, usd]) => [c, usd]),
		costs: e.costs.map(([c, usd]) => [c, usd])
	});
	const sumInto = (into: EnterpriseYear, from: EnterpriseYear) => {
		from.returns.forEach(([, usd], i) => (into.returns[i][1] += usd));
		from.costs.forEach(([, usd], i) => (into.costs[i][1] += usd));
	};
	for (const fieldId of new Set([...reference.fields.keys(), ...plan.fields.keys()])) {
		const p = plan.fields.get(fieldId);
		const r = reference.fields.get(fieldId);
		if (p && r && p.enterprise === r.enterprise) {
			const sum = sameCrop.get(p.enterprise);
			if (!sum) sameCrop.set(p.enterprise, { plan: copy(p), reference: copy(r) });
			else {
				sumInto(sum.plan, p);
				sumInto(sum.reference, r);
			}
			continue;
		}
		if (r) gross(r, 'reducedReturns', 'reducedCosts');
		if (p) gross(p, 'addedReturns', 'addedCosts');
	}
	for (const { plan: p, reference: r } of sameCrop.values()) net(p, r);
	net(plan.herd, reference.herd);
	net(plan.farm, reference.farm);

	return {
		addedReturns: part('addedReturns').lines(),
		reducedCosts: part('reducedCosts').lines(),
		addedCosts: part('addedCosts').lines(),
		reducedReturns: part('reducedReturns').lines()
	};
}

function sumLines(lines: BudgetLine[]): number {
	return lines.reduce((sum, line) => sum + line.amountUsd, 0);
}

function parts(lines: PartialBudgetYear['lines']): BudgetParts {
	const addedReturnsUsd = sumLines(lines.addedReturns);
	const reducedCostsUsd = sumLines(lines.reducedCosts);
	const addedCostsUsd = sumLines(lines.addedCosts);
	const reducedReturnsUsd = sumLines(lines.reducedReturns);
	return {
		addedReturnsUsd,
		reducedCostsUsd,
		addedCostsUsd,
		reducedReturnsUsd,
		// NDSU (Saxowsky) and Purdue (Langemeier): net change = (added returns + reduced costs) − (added costs + reduced returns)
		netChangeUsd: addedReturnsUsd + reducedCostsUsd - addedCostsUsd - reducedReturnsUsd
	};
}

function perAcre(p: BudgetParts, acres: number): BudgetParts {
	return {
		addedReturnsUsd: p.addedReturnsUsd / acres,
		reducedCostsUsd: p.reducedCostsUsd / acres,
		addedCostsUsd: p.addedCostsUsd / acres,
		reducedReturnsUsd: p.reducedReturnsUsd / acres,
		netChangeUsd: p.netChangeUsd / acres
	};
}

function averageLines(lists: BudgetLine[][], years: number): BudgetLine[] {
	const totals = new Map<string, BudgetLine>();
	for (const list of lists) {
		for (const line of list) {
			const key = `${line.enterprise}\u0000${line.category}`;
			const total = totals.get(key);
			if (total) total.amountUsd += line.amountUsd;
			else totals.set(key, { ...line });
		}
	}
	return [...totals.values()]
		.map((line) => ({ ...line, amountUsd: line.amountUsd / years }))
		.sort((a, b) => b.amountUsd - a.amountUsd);
}

export function partialBudget(
	referencePlanName: string,
	acres: number,
	planYears: { year: number; items: YearItems }[],
	referenceItemsByYear: Map<number, YearItems>
): PartialBudget {
	const years = planYears.map(({ year, items }) => {
		const lines = budgetYearLines(items, referenceItemsByYear.get(year)!);
		const p = parts(lines);
		return { year, ...p, perAcre: perAcre(p, acres), lines };
	});
	const n = years.length;
	const averageOf = (name: PartName) =>
		averageLines(
			years.map((y) => y.lines[name]),
			n
		);
	const averageLinesByPart = {
		addedReturns: averageOf('addedReturns'),
		reducedCosts: averageOf('reducedCosts'),
		addedCosts: averageOf('addedCosts'),
		reducedReturns: averageOf('reducedReturns')
	};
	const average = parts(averageLinesByPart);
	return {
		referencePlanName,
		acres,
		years,
		average: { ...average, perAcre: perAcre(average, acres), lines: averageLinesByPart }
	};
}
