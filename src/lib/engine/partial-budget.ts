import type { FarmYearResult } from './farm-year';
import type { FieldYearResult } from './field-year';

export interface BudgetLine {
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

/** What one plan-year earns and spends, item by item, for comparing two plans. */
interface YearItems {
	returns: Map<string, number>;
	costs: Map<string, number>;
}

const cropLabels: Record<FieldYearResult['crop'], string> = {
	corn: 'Corn',
	soybean: 'Soybean',
	wheat: 'Wheat',
	oats: 'Oats',
	barley: 'Barley',
	rye: 'Rye',
	'oat-pea-forage': 'Oat–pea forage',
	hay: 'Hay'
};

function add(map: Map<string, number>, item: string, amountUsd: number) {
	map.set(item, (map.get(item) ?? 0) + amountUsd);
}

export function yearItems(fieldYears: FieldYearResult[], farmYear: FarmYearResult): YearItems {
	const returns = new Map<string, number>();
	const costs = new Map<string, number>();
	for (const fy of fieldYears) {
		add(returns, `${cropLabels[fy.crop]} sales`, fy.revenueUsd);
		const d = fy.directCosts;
		add(costs, 'Seed', d.seedUsd);
		add(costs, 'Nitrogen fertiliser', d.nitrogenUsd);
		add(costs, 'Other fertiliser', d.otherFertiliserUsd);
		add(costs, 'Chemicals', d.chemicalsUsd);
		add(costs, 'Drying, hauling, insurance and other', d.otherDirectUsd);
		add(costs, 'Cover crop seed', d.coverSeedUsd);
		add(costs, 'Custom hire', d.customHireUsd);
		add(costs, 'Operating interest', d.operatingInterestUsd);
		add(costs, 'Diesel', fy.operationCosts.fuelUsd);
		add(costs, 'Machinery repairs', fy.operationCosts.repairsUsd);
		add(costs, 'Field labour', fy.operationCosts.labourUsd);
	}
	add(costs, 'Purchased hay', farmYear.hayCostUsd);
	add(costs, 'Chore labour', farmYear.choreLabourUsd);
	add(costs, 'Fixed costs', farmYear.fixedCostsUsd);
	return { returns, costs };
}

// Differences smaller than a hundredth of a cent are rounding, not a change worth a line.
const negligibleUsd = 1e-4;

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

/**
 * Sorts every item that changes into the four parts of a partial budget (only items that change are
 * listed: NDSU, Saxowsky): more revenue is an added return, less a reduced return; more cost an added
 * cost, less a reduced cost.
 */
function budgetYearLines(plan: YearItems, reference: YearItems): PartialBudgetYear['lines'] {
	const lines: PartialBudgetYear['lines'] = {
		addedReturns: [],
		reducedCosts: [],
		addedCosts: [],
		reducedReturns: []
	};
	const compare = (
		planItems: Map<string, number>,
		referenceItems: Map<string, number>,
		up: BudgetLine[],
		down: BudgetLine[]
	) => {
		const items = new Set([...referenceItems.keys(), ...planItems.keys()]);
		for (const item of items) {
			const change = (planItems.get(item) ?? 0) - (referenceItems.get(item) ?? 0);
			if (change > negligibleUsd) up.push({ item, amountUsd: change });
			else if (change < -negligibleUsd) down.push({ item, amountUsd: -change });
		}
	};
	compare(plan.returns, reference.returns, lines.addedReturns, lines.reducedReturns);
	compare(plan.costs, reference.costs, lines.addedCosts, lines.reducedCosts);
	return lines;
}

function averageLines(lists: BudgetLine[][], years: number): BudgetLine[] {
	const totals = new Map<string, number>();
	for (const list of lists) for (const line of list) add(totals, line.item, line.amountUsd);
	return [...totals].map(([item, amountUsd]) => ({ item, amountUsd: amountUsd / years }));
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
	const averageLinesByPart = {
		addedReturns: averageLines(
			years.map((y) => y.lines.addedReturns),
			n
		),
		reducedCosts: averageLines(
			years.map((y) => y.lines.reducedCosts),
			n
		),
		addedCosts: averageLines(
			years.map((y) => y.lines.addedCosts),
			n
		),
		reducedReturns: averageLines(
			years.map((y) => y.lines.reducedReturns),
			n
		)
	};
	const average = parts(averageLinesByPart);
	return {
		referencePlanName,
		acres,
		years,
		average: { ...average, perAcre: perAcre(average, acres), lines: averageLinesByPart }
	};
}
