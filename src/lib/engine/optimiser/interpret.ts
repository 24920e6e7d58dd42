import { MONTH_NAMES as monthNames } from '../../months';
import type { FarmModel, RowRole } from './farm-model';
import type {
	BindingLimit,
	FieldChoice,
	LimitConflict,
	OptimisedYear,
	OptimiseResult,
	OptimiseStatus
} from './types';

/** What a solver answered, in the model's own terms (any solver's adapter fills it). */
export interface SolverAnswer {
	status: OptimiseStatus;
	message: string;
	/** The objective, constant term included; null without an answer. */
	objective: number | null;
	columnValues: Float64Array | null;
	rowValues: Float64Array | null;
	/**
	 * What raising each row's binding bound by one unit adds to the objective (negative: costs). For a
	 * whole-field answer, from the LP with the fields' choices held where they are.
	 */
	rowMarginalValues: Float64Array | null;
	bestBound: number | null;
	gapPercent: number | null;
	/** Rows and columns in a set of limits that cannot all hold (infeasible only). */
	conflictRows: number[];
	conflictColumns: number[];
	solveMs: number;
}

const usd = (n: number) =>
	n.toLocaleString('en-US', { style: 'currency', currency: 'USD', maximumFractionDigits: 2 });
const figure = (n: number) => n.toLocaleString('en-US', { maximumFractionDigits: 1 });

// Below a tenth of a cent per unit, a limit costs nothing worth saying.
const bindingTolerance = 1e-3;
// Shares below this are the solver's rounding, not a rotation on part of a field.
const shareTolerance = 1e-6;

/** A limit the user set, in words, and the unit one more of it is counted in. */
function describeLimit(farm: FarmModel, role: RowRole): { what: string; unit: string } | null {
	const year = (y: number) => farm.years[y];
	switch (role.kind) {
		case 'family-labour':
			return {
				what: `family hour in ${monthNames[role.month]} ${year(role.yearIndex)}`,
				unit: 'hour'
			};
		case 'family-span': {
			const months = role.months.map((m) => monthNames[m].slice(0, 3)).join(', ');
			return { what: `family hour in ${months} ${year(role.yearIndex)}`, unit: 'hour' };
		}
		case 'nitrogen':
			return { what: `lb of purchased N in ${year(role.yearIndex)}`, unit: 'lb N' };
		case 'diesel':
			return { what: `gallon of diesel in ${year(role.yearIndex)}`, unit: 'gallon' };
		case 'crop':
			return { what: `acre of ${role.cropName} in ${year(role.yearIndex)}`, unit: 'acre' };
		default:
			return null;
	}
}

function bindingLimits(farm: FarmModel, answer: SolverAnswer): BindingLimit[] {
	const values = answer.rowMarginalValues;
	if (!values) return [];
	const limits: BindingLimit[] = [];
	farm.rowRoles.forEach((role, i) => {
		const value = values[i];
		if (Math.abs(value) < bindingTolerance) return;
		const described = describeLimit(farm, role);
		if (!described) return;
		const row = farm.model.rows[i];
		const atUpper = value > 0;
		const limit = role.kind === 'crop' ? (atUpper ? row.upper : row.lower) : farm.rowLimits[i];
		const label =
			role.kind === 'crop' && !atUpper
				? `Each ${described.what} required costs ${usd(-value)}.`
				: `One more ${described.what} is worth ${usd(value)}.`;
		limits.push({ name: row.name, label, marginalValueUsd: value, unit: described.unit, limit });
	});
	return limits.sort((a, b) => Math.abs(b.marginalValueUsd) - Math.abs(a.marginalValueUsd));
}

function conflicts(farm: FarmModel, answer: SolverAnswer): LimitConflict[] {
	const { plan } = farm;
	const out: LimitConflict[] = [];
	for (const i of answer.conflictRows) {
		const role = farm.rowRoles[i];
		const name = farm.model.rows[i].name;
		const limit = farm.rowLimits[i];
		const year = 'yearIndex' in role ? farm.years[role.yearIndex] : null;
		switch (role.kind) {
			case 'field':
				out.push({ name, label: `${plan.fields[role.fieldIndex].name} must be farmed, whole.` });
				break;
			case 'family-labour':
				out.push({
					name,
					label: `Family hours in ${monthNames[role.month]} ${year}: at most ${figure(limit)} hours.`
				});
				break;
			case 'work':
				out.push({
					name,
					label:
						limit > 0
							? `The work of ${monthNames[role.month]} ${year}: the herd's chores take ${figure(limit)} hours, besides any field work.`
							: `The field work of ${monthNames[role.month]} ${year} needs hours.`
				});
				break;
			case 'family-span':
				out.push({
					name,
					label: `Family hours in the chosen months of ${year}: at most ${figure(limit)} hours.`
				});
				break;
			case 'nitrogen':
				out.push({ name, label: `Purchased N in ${year}: at most ${figure(limit)} lb.` });
				break;
			case 'diesel':
				out.push({ name, label: `Diesel in ${year}: at most ${figure(limit)} gallons.` });
				break;
			case 'crop': {
				const row = farm.model.rows[i];
				const bounds = [
					Number.isFinite(row.lower) ? `at least ${figure(row.lower)}` : null,
					Number.isFinite(row.upper) ? `at most ${figure(row.upper)}` : null
				].filter(Boolean);
				out.push({ name, label: `${role.cropName} in ${year}: ${bounds.join(' and ')} acres.` });
				break;
			}
			case 'forage':
				out.push({ name, label: `The herd must be fed through the feeding season of ${year}.` });
				break;
			default:
				break;
		}
	}
	if (answer.conflictColumns.some((j) => farm.columnRoles[j].kind === 'hired')) {
		out.push({ name: 'hired', label: 'Hired help: at most the hours each hired person has.' });
	}
	return out;
}

function fieldChoices(farm: FarmModel, values: Float64Array): FieldChoice[] {
	const { plan } = farm;
	const byField = plan.fields.map((field) => ({
		fieldId: field.id,
		fieldName: field.name,
		acres: field.acres,
		rotations: [] as FieldChoice['rotations'],
		split: false
	}));
	for (const choice of farm.choices) {
		const share = values[choice.column];
		if (share < shareTolerance) continue;
		const field = byField[choice.fieldIndex];
		field.rotations.push({
			rotationId: choice.rotationId,
			rotationName: choice.rotationName,
			startingPhase: choice.startingPhase,
			acres: share * field.acres
		});
	}
	for (const field of byField) {
		field.rotations.sort((a, b) => b.acres - a.acres);
		field.split = field.rotations.length > 1;
	}
	return byField;
}

function optimisedYears(farm: FarmModel, values: Float64Array): OptimisedYear[] {
	const { plan } = farm;
	return farm.years.map((year, y) => {
		let netReturnUsd = farm.netReturnConstantUsdByYear[y];
		farm.netReturnUsdByColumnYear.forEach((byYear, j) => (netReturnUsd += byYear[y] * values[j]));
		let nitrogenPurchasedLb = 0;
		let dieselGallons = 0;
		const cropAcres = new Map<string, { cropId: string; cropName: string; acres: number }>();
		for (const c of farm.choices) {
			const share = values[c.column];
			if (share < shareTolerance) continue;
			const cy = c.years[y];
			nitrogenPurchasedLb += share * cy.nitrogenPurchasedLb;
			dieselGallons += share * cy.dieselGallons;
			const crop = cropAcres.get(cy.cropId) ?? {
				cropId: cy.cropId,
				cropName: cy.cropName,
				acres: 0
			};
			crop.acres += share * plan.fields[c.fieldIndex].acres;
			cropAcres.set(cy.cropId, crop);
		}
		const familyLabourHoursByMonth = new Array<number>(12).fill(0);
		const hiredLabourHoursByMonth = new Array<number>(12).fill(0);
		let grazingAuDays = 0;
		let hayBales = 0;
		farm.columnRoles.forEach((role, j) => {
			if (!('yearIndex' in role) || role.yearIndex !== y) return;
			if (role.kind === 'work') familyLabourHoursByMonth[role.month] += values[j];
			if (role.kind === 'hired') {
				hiredLabourHoursByMonth[role.month] += values[j];
				familyLabourHoursByMonth[role.month] -= values[j];
			}
			if (role.kind === 'grazing') grazingAuDays += values[j];
			if (role.kind === 'hay') hayBales += values[j];
		});
		const labourHours =
			familyLabourHoursByMonth.reduce((a, b) => a + b, 0) +
			hiredLabourHoursByMonth.reduce((a, b) => a + b, 0);
		return {
			year,
			netReturnUsd,
			nitrogenPurchasedLb,
			dieselGallons,
			labourHours,
			familyLabourHoursByMonth,
			hiredLabourHoursByMonth,
			grazingAuDays,
			hayBales,
			cropAcres: [...cropAcres.values()].sort((a, b) => b.acres - a.acres)
		};
	});
}

const statusMessages = new Map<OptimiseStatus, string>([
	['optimal', 'The best mix within every limit.'],
	['infeasible', 'No mix keeps every limit: relax one of the limits named below.'],
	['time-limit', 'Stopped at the time limit: the best mix found so far.'],
	['unbounded', 'The net return could grow without end: a limit the farm needs is missing.'],
	['error', 'The solver failed.']
]);

/** The solver's answer as the optimiser's result: fields, years, binding limits, conflicts. */
export function interpretAnswer(farm: FarmModel, answer: SolverAnswer): OptimiseResult {
	const values = answer.columnValues;
	const years = values ? optimisedYears(farm, values) : [];
	return {
		status: answer.status,
		message: answer.message || statusMessages.get(answer.status)!,
		wholeFields: farm.options.wholeFields,
		objectiveUsd: values ? answer.objective : null,
		netReturnUsd: values ? years.reduce((sum, y) => sum + y.netReturnUsd, 0) : null,
		bestBoundUsd: answer.bestBound,
		gapPercent: answer.gapPercent,
		fields: values ? fieldChoices(farm, values) : [],
		years,
		bindingLimits: values ? bindingLimits(farm, answer) : [],
		conflicts: answer.status === 'infeasible' ? conflicts(farm, answer) : [],
		assumptions: farm.assumptions,
		model: {
			rows: farm.model.rows.length,
			columns: farm.model.columns.length,
			integerColumns: farm.model.columns.filter((c) => c.integer).length
		},
		solveMs: answer.solveMs
	};
}
