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

/** Categories of return and cost, each with the words a line prints; `sales` is the one return. */
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
	'cash-rent': 'cash rent',
	hay: 'purchased hay',
	'chore-labour': 'chore labour',
	'hired-labour': "hired help's wages less the labour rate",
	'fixed-costs': 'fixed costs'
} as const;
export type Category = keyof typeof categoryWords;
const categories = Object.keys(categoryWords) as Category[];
const words = Object.values(categoryWords) as string[];
const categoryCount = categories.length;
// Amounts are kept in arrays indexed by category: a 100-field plan compares thousands of them.
const salesIndex = categories.indexOf('sales');
const at = new Map(categories.map((c, i) => [c, i]));
const index = (category: Category) => at.get(category)!;

/** What one enterprise on one field (or the herd, or the farm) earns and spends in a year, by category. */
interface EnterpriseYear {
	enterprise: string;
	name: string;
	amounts: Float64Array;
}

/** One plan-year, ready to compare: each field's crop, the herd and the farm's fixed costs. */
export interface YearItems {
	fields: Map<string, EnterpriseYear>;
	herd: EnterpriseYear;
	farm: EnterpriseYear;
}

function enterpriseYear(enterprise: string, name: string, amounts: [Category, number][]) {
	const year: EnterpriseYear = { enterprise, name, amounts: new Float64Array(categoryCount) };
	for (const [category, usd] of amounts) year.amounts[index(category)] = usd;
	return year;
}

// Where a field-year's amounts go, in the order `fieldAmounts` writes them.
const fieldCategoryIndexes = (
	[
		'sales',
		'seed',
		'nitrogen',
		'other-fertiliser',
		'chemicals',
		'other-direct',
		'cover-seed',
		'custom-hire',
		'operating-interest',
		'diesel',
		'repairs',
		'field-labour',
		'cash-rent'
	] as const
).map(index);

function fieldAmounts(fy: FieldYearResult): Float64Array {
	const d = fy.directCosts;
	const o = fy.operationCosts;
	const values = [
		fy.revenueUsd,
		d.seedUsd,
		d.nitrogenUsd,
		d.otherFertiliserUsd,
		d.chemicalsUsd,
		d.otherDirectUsd,
		d.coverSeedUsd,
		d.customHireUsd,
		d.operatingInterestUsd,
		o.fuelUsd,
		o.repairsUsd,
		o.labourUsd,
		fy.cashRentUsd
	];
	const amounts = new Float64Array(categoryCount);
	for (let k = 0; k < values.length; k++) amounts[fieldCategoryIndexes[k]] = values[k];
	return amounts;
}

export function yearItems(fieldYears: FieldYearResult[], farmYear: FarmYearResult): YearItems {
	const fields = new Map<string, EnterpriseYear>();
	for (const fy of fieldYears) {
		fields.set(fy.fieldId, { enterprise: fy.crop, name: fy.cropName, amounts: fieldAmounts(fy) });
	}
	return {
		fields,
		herd: enterpriseYear('herd', 'Herd', [
			['hay', farmYear.hayCostUsd],
			['chore-labour', farmYear.choreLabourUsd]
		]),
		farm: enterpriseYear('farm', 'Whole farm', [
			['hired-labour', farmYear.hiredWageAdjustmentUsd],
			['fixed-costs', farmYear.fixedCostsUsd]
		])
	};
}

// Differences smaller than a hundredth of a cent are rounding, not a change worth a line.
const negligibleUsd = 1e-4;

type PartName = keyof PartialBudgetYear['lines'];

/** One part's amounts, by enterprise and category. */
class PartTotals {
	private readonly byEnterprise = new Map<string, EnterpriseYear>();

	add(e: EnterpriseYear, i: number, usd: number) {
		let total = this.byEnterprise.get(e.enterprise);
		if (!total) {
			total = { enterprise: e.enterprise, name: e.name, amounts: new Float64Array(categoryCount) };
			this.byEnterprise.set(e.enterprise, total);
		}
		total.amounts[i] += usd;
	}

	lines(): BudgetLine[] {
		const lines: BudgetLine[] = [];
		for (const { enterprise, name, amounts } of this.byEnterprise.values()) {
			for (let i = 0; i < categoryCount; i++) {
				if (amounts[i] > negligibleUsd) {
					lines.push({
						enterprise,
						category: categories[i],
						item: `${name}: ${words[i]}`,
						amountUsd: amounts[i]
					});
				}
			}
		}
		return lines.sort((a, b) => b.amountUsd - a.amountUsd);
	}
}

/**
 * The four parts of one year (NDSU, Saxowsky; Purdue, Langemeier: only what changes is listed). A field
 * that changes crop is budgeted gross: the old crop's returns are reduced returns and its costs reduced
 * costs, each in full, and the new crop's are added returns and added costs. Where the same crop keeps
 * its place, and for the herd and the farm, only the net change of each category is listed.
 */
function budgetYearLines(plan: YearItems, reference: YearItems): PartialBudgetYear['lines'] {
	const addedReturns = new PartTotals();
	const reducedCosts = new PartTotals();
	const addedCosts = new PartTotals();
	const reducedReturns = new PartTotals();
	const gross = (e: EnterpriseYear, added: boolean) => {
		for (let i = 0; i < categoryCount; i++) {
			const usd = e.amounts[i];
			if (usd === 0) continue;
			if (i === salesIndex) (added ? addedReturns : reducedReturns).add(e, i, usd);
			else (added ? addedCosts : reducedCosts).add(e, i, usd);
		}
	};
	const net = (e: EnterpriseYear, change: Float64Array) => {
		for (let i = 0; i < categoryCount; i++) {
			const usd = change[i];
			if (i === salesIndex) {
				if (usd > 0) addedReturns.add(e, i, usd);
				else if (usd < 0) reducedReturns.add(e, i, -usd);
			} else if (usd > 0) addedCosts.add(e, i, usd);
			else if (usd < 0) reducedCosts.add(e, i, -usd);
		}
	};
	const difference = (p: EnterpriseYear, r: EnterpriseYear) =>
		p.amounts.map((usd, i) => usd - r.amounts[i]);

	// Same-crop changes are netted across fields first, so one field's saving offsets another's cost.
	const sameCrop = new Map<string, { e: EnterpriseYear; change: Float64Array }>();
	for (const fieldId of new Set([...reference.fields.keys(), ...plan.fields.keys()])) {
		const p = plan.fields.get(fieldId);
		const r = reference.fields.get(fieldId);
		if (p && r && p.enterprise === r.enterprise) {
			const sum = sameCrop.get(p.enterprise);
			if (!sum) sameCrop.set(p.enterprise, { e: p, change: difference(p, r) });
			else for (let i = 0; i < categoryCount; i++) sum.change[i] += p.amounts[i] - r.amounts[i];
			continue;
		}
		if (r) gross(r, false);
		if (p) gross(p, true);
	}
	for (const { e, change } of sameCrop.values()) net(e, change);
	net(plan.herd, difference(plan.herd, reference.herd));
	net(plan.farm, difference(plan.farm, reference.farm));

	return {
		addedReturns: addedReturns.lines(),
		reducedCosts: reducedCosts.lines(),
		addedCosts: addedCosts.lines(),
		reducedReturns: reducedReturns.lines()
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
