import type { FieldIssue } from '../../schemas/issues';
import type { OptimiseOptions } from '../../schemas/optimise';
import type { PlanDocument } from '../../schemas/plan-file';
import { familyHoursByMonth } from '../../schemas/plan-file';
import { creditsForNextYear } from '../field-year';
import { animalUnits } from '../forage';
import { evaluateFieldInYear, planLookups, startingCredits } from '../index';
import { ModelBuilder, RowEntries, type LinearModel } from './linear-model';

/**
 * The whole-farm model: how much of each field goes under each rotation from each starting phase,
 * hay bought and grazing eaten each year, hired hours each month. The per-acre numbers of every choice
 * come from the engine's own field-year budgets, evaluated for that field under that rotation and phase,
 * so N credits, residue and grazing follow the rotation as they do in a plan.
 */

/** One year of a field under one rotation and phase, for the whole field. */
export interface ChoiceYear {
	cropId: string;
	cropName: string;
	netReturnUsd: number;
	nitrogenPurchasedLb: number;
	dieselGallons: number;
	labourHours: number;
	labourHoursByMonth: number[];
	grazingAuDays: number;
}

export interface Choice {
	column: number;
	fieldIndex: number;
	rotationId: string;
	rotationName: string;
	startingPhase: number;
	years: ChoiceYear[];
}

export type ColumnRole =
	| { kind: 'choice'; choice: number }
	| { kind: 'grazing'; yearIndex: number; month: number }
	| { kind: 'hay'; yearIndex: number }
	| { kind: 'work'; yearIndex: number; month: number }
	| { kind: 'hired'; wageUsdPerHour: number; yearIndex: number; month: number };

export type RowRole =
	| { kind: 'field'; fieldIndex: number }
	| { kind: 'work'; yearIndex: number; month: number }
	| { kind: 'family-labour'; yearIndex: number; month: number }
	| { kind: 'hired-within-work'; yearIndex: number; month: number }
	| { kind: 'family-span'; yearIndex: number; months: number[] }
	| { kind: 'nitrogen'; yearIndex: number }
	| { kind: 'diesel'; yearIndex: number }
	| { kind: 'crop'; cropId: string; cropName: string; yearIndex: number }
	| { kind: 'grazing-offered'; yearIndex: number }
	| { kind: 'forage'; yearIndex: number };

export interface FarmModel {
	model: LinearModel;
	plan: PlanDocument;
	options: OptimiseOptions;
	years: number[];
	choices: Choice[];
	columnRoles: ColumnRole[];
	rowRoles: RowRole[];
	/** Each column's share of the budgets' net return, by year (the weights left out). */
	netReturnUsdByColumnYear: Float64Array[];
	/** The budgets' net return that comes whatever is chosen, by year (fixed costs, hay-day chores). */
	netReturnConstantUsdByYear: number[];
	/** Each row's limit as the user set it (before constants moved to the right-hand side). */
	rowLimits: number[];
	assumptions: string[];
}

export type BuiltModel = { ok: true; farm: FarmModel } | { ok: false; issues: FieldIssue[] };

// Days in each month of a common year, as the forage ledger's chore calendar counts them.
const daysInMonth = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** LP names allow letters, digits and a few marks but no hyphen: ids have none of '.', so it is safe. */
export function lpName(id: string): string {
	return id.replaceAll('-', '.');
}

const monthNumber = (m: number) => String(m + 1).padStart(2, '0');

/** The feeding season cut at month ends: [month, first day, last day + 1] from the season's start. */
function seasonSegments(startMonth: number, seasonDays: number) {
	const segments: { month: number; from: number; to: number }[] = [];
	let month = startMonth - 1;
	let from = 0;
	while (from < seasonDays) {
		const to = Math.min(from + daysInMonth[month], seasonDays);
		segments.push({ month, from, to });
		from = to;
		month = (month + 1) % 12;
	}
	return segments;
}

function checkOptions(plan: PlanDocument, options: OptimiseOptions): FieldIssue[] {
	const issues: FieldIssue[] = [];
	const fieldIds = new Set(plan.fields.map((f) => f.id));
	const rotationById = new Map(plan.rotations.map((r) => [r.id, r]));
	const cropIds = new Set(plan.crops.map((c) => c.id));
	const { limits } = options;
	limits.crops.forEach((limit, i) => {
		if (!cropIds.has(limit.cropId)) {
			issues.push({ path: `limits.crops.${i}.cropId`, message: `No crop "${limit.cropId}".` });
		}
		if (limit.minAcres !== null && limit.maxAcres !== null && limit.minAcres > limit.maxAcres) {
			issues.push({
				path: `limits.crops.${i}.minAcres`,
				message: 'The least acres of the crop must not be more than the most.'
			});
		}
	});
	const fixed = new Set<string>();
	limits.fixedFields.forEach((f, i) => {
		if (!fieldIds.has(f.fieldId)) {
			issues.push({ path: `limits.fixedFields.${i}.fieldId`, message: `No field "${f.fieldId}".` });
		} else if (fixed.has(f.fieldId)) {
			issues.push({
				path: `limits.fixedFields.${i}.fieldId`,
				message: 'This field is already fixed to a rotation.'
			});
		}
		fixed.add(f.fieldId);
		const rotation = rotationById.get(f.rotationId);
		if (!rotation) {
			issues.push({
				path: `limits.fixedFields.${i}.rotationId`,
				message: `No rotation "${f.rotationId}".`
			});
		} else if (f.startingPhase !== null && f.startingPhase > rotation.practices.length) {
			issues.push({
				path: `limits.fixedFields.${i}.startingPhase`,
				message: `The rotation "${rotation.name}" has ${rotation.practices.length} years: start it at 1 to ${rotation.practices.length}.`
			});
		}
	});
	(limits.rotationIds ?? []).forEach((id, i) => {
		if (!rotationById.has(id)) {
			issues.push({ path: `limits.rotationIds.${i}`, message: `No rotation "${id}".` });
		}
	});
	return issues;
}

/** Every year of one field under one rotation and phase; credits carried as a plan carries them. */
function evaluateChoice(
	plan: PlanDocument,
	lookups: ReturnType<typeof planLookups>,
	fieldIndex: number,
	rotation: PlanDocument['rotations'][number],
	startingPhase: number,
	eatenShare: number
): ChoiceYear[] {
	const field = plan.fields[fieldIndex];
	let credits = startingCredits(field);
	const years: ChoiceYear[] = [];
	for (let i = 0; i < plan.plan.horizon.years; i++) {
		const { result, practice } = evaluateFieldInYear(
			plan,
			lookups,
			field,
			rotation,
			startingPhase,
			i,
			credits
		);
		result.forage.eatenAuDays = result.forage.grazingAuDays * eatenShare;
		credits = creditsForNextYear(practice, result, plan.herd, eatenShare);
		years.push({
			cropId: result.crop,
			cropName: result.cropName,
			netReturnUsd: result.netReturnUsd,
			nitrogenPurchasedLb: result.nitrogen.purchasedLb,
			dieselGallons: result.dieselGallons,
			labourHours: result.labourHours,
			labourHoursByMonth: result.labourHoursByMonth,
			grazingAuDays: result.forage.grazingAuDays
		});
	}
	return years;
}

/** Every cost, coefficient and finite bound a number (bounds may be infinite: no bound). */
function isFinite(model: LinearModel): boolean {
	const ok = (n: number) => Number.isFinite(n);
	const bound = (n: number) => !Number.isNaN(n);
	return (
		Number.isFinite(model.offset) &&
		model.columns.every((c) => ok(c.cost) && bound(c.lower) && bound(c.upper)) &&
		model.rows.every((r) => bound(r.lower) && bound(r.upper) && r.values.every(ok))
	);
}

/** A row's entries on items that each own a column: choices, grazing months. */
function entriesOf<T extends { column: number }>(items: T[], value: (item: T) => number) {
	return new RowEntries().append(items, value);
}

/** Builds the farm model for a validated plan and options; issues name options that do not fit it. */
export function buildFarmModel(plan: PlanDocument, options: OptimiseOptions): BuiltModel {
	const issues = checkOptions(plan, options);
	if (issues.length) return { ok: false, issues };

	const { limits, weights } = options;
	const lookups = planLookups(plan);
	const years = Array.from(
		{ length: plan.plan.horizon.years },
		(_, i) => plan.plan.horizon.startYear + i
	);
	const prices = years.map((year) => lookups.pricesByYear.get(year)!);
	const builder = new ModelBuilder(`Furrowcast whole-farm model: ${plan.plan.name}`);
	const columnRoles: ColumnRole[] = [];
	const rowRoles: RowRole[] = [];
	const rowLimits: number[] = [];
	const netReturnByColumn: number[][] = [];
	const addColumn = (
		role: ColumnRole,
		column: Parameters<ModelBuilder['addColumn']>[0],
		netReturnByYear: number[]
	) => {
		columnRoles.push(role);
		netReturnByColumn.push(netReturnByYear);
		return builder.addColumn(column);
	};
	const addRow = (
		role: RowRole,
		name: string,
		bounds: { lower?: number; upper?: number; limit?: number },
		entries: RowEntries
	) => {
		rowRoles.push(role);
		rowLimits.push(bounds.limit ?? bounds.upper ?? bounds.lower ?? 0);
		return builder.addRow(name, bounds.lower ?? -Infinity, bounds.upper ?? Infinity, entries);
	};

	// Choices: every field under every allowed rotation and phase (a fixed field under its own only).
	const herd = plan.herd;
	const units = herd ? animalUnits(herd.head, herd.averageWeightLb) : 0;
	// The model grazes what the fields offer up to what the herd eats; credits assume all of it eaten.
	const eatenShare = units > 0 ? 1 : 0;
	const fixedByField = new Map(limits.fixedFields.map((f) => [f.fieldId, f]));
	const allowed = limits.rotationIds ? new Set(limits.rotationIds) : null;
	const choices: Choice[] = [];
	plan.fields.forEach((field, fieldIndex) => {
		const fixed = fixedByField.get(field.id);
		for (const rotation of plan.rotations) {
			if (fixed ? fixed.rotationId !== rotation.id : allowed && !allowed.has(rotation.id)) continue;
			for (let phase = 1; phase <= rotation.practices.length; phase++) {
				if (fixed?.startingPhase != null && fixed.startingPhase !== phase) continue;
				const choiceYears = evaluateChoice(plan, lookups, fieldIndex, rotation, phase, eatenShare);
				const cost = choiceYears.reduce(
					(sum, y) =>
						sum +
						y.netReturnUsd -
						weights.nitrogenUsdPerLb * y.nitrogenPurchasedLb -
						weights.dieselUsdPerGallon * y.dieselGallons,
					0
				);
				const column = addColumn(
					{ kind: 'choice', choice: choices.length },
					{
						name: `share_${lpName(field.id)}_${lpName(rotation.id)}_p${phase}`,
						cost,
						lower: 0,
						upper: 1,
						integer: options.wholeFields
					},
					choiceYears.map((y) => y.netReturnUsd)
				);
				choices.push({
					column,
					fieldIndex,
					rotationId: rotation.id,
					rotationName: rotation.name,
					startingPhase: phase,
					years: choiceYears
				});
			}
		}
	});
	const choicesByField = plan.fields.map(() => [] as Choice[]);
	for (const choice of choices) choicesByField[choice.fieldIndex].push(choice);

	// The herd: grazing by month of the feeding season, hay, and the chores each day needs.
	const netReturnConstantUsdByYear = years.map(() => -plan.farm.fixedCostsUsdPerYear);
	const baseChoreHours = years.map(() => new Array<number>(12).fill(0));
	const grazingColumns = years.map(() => [] as { column: number; month: number }[]);
	const hayColumns: number[] = [];
	const choreHoursSavedPerAuDay =
		herd && units > 0
			? (herd.choreHoursPerDayFeedingHay - herd.choreHoursPerDayGrazing) / units
			: 0;
	if (herd && units > 0) {
		const grazingDayLimit = Math.min(herd.feedingSeasonDays, herd.maxGrazingDays ?? Infinity);
		const segments = seasonSegments(herd.feedingSeasonStartMonth, herd.feedingSeasonDays);
		years.forEach((year, y) => {
			const rate = prices[y].labourUsdPerHour;
			for (const [k, segment] of segments.entries()) {
				baseChoreHours[y][segment.month] +=
					(segment.to - segment.from) * herd.choreHoursPerDayFeedingHay;
				const grazingDays = Math.max(0, Math.min(segment.to, grazingDayLimit) - segment.from);
				const saving = choreHoursSavedPerAuDay * rate;
				grazingColumns[y].push({
					month: segment.month,
					column: addColumn(
						{ kind: 'grazing', yearIndex: y, month: segment.month },
						{
							name: `grazing_${year}_${monthNumber(segment.month)}_${k + 1}`,
							cost: saving + weights.grazingUsdPerAuDay,
							lower: 0,
							upper: units * grazingDays,
							integer: false
						},
						years.map((_, i) => (i === y ? saving : 0))
					)
				});
			}
			const choreHours = herd.feedingSeasonDays * herd.choreHoursPerDayFeedingHay;
			netReturnConstantUsdByYear[y] -= choreHours * rate;
			hayColumns.push(
				addColumn(
					{ kind: 'hay', yearIndex: y },
					{
						name: `hay_bales_${year}`,
						cost: -prices[y].hayUsdPerBale,
						lower: 0,
						upper: Infinity,
						integer: false
					},
					years.map((_, i) => (i === y ? -prices[y].hayUsdPerBale : 0))
				)
			);
		});
	}

	// All the work of each month (field work and chores), the family's and hired: a column, so the
	// dense sum over every choice is written once and the labour limits are short rows on it.
	const workColumns = years.map((year, y) =>
		Array.from({ length: 12 }, (_, m) =>
			addColumn(
				{ kind: 'work', yearIndex: y, month: m },
				{
					name: `work_${year}_${monthNumber(m)}`,
					// The value the couple put on an hour of their own; hired hours get it back below.
					cost: -weights.familyLabourUsdPerHour,
					lower: 0,
					upper: Infinity,
					integer: false
				},
				years.map(() => 0)
			)
		)
	);

	// Hired help, pooled by wage: hours each month up to what the hired people at that wage have.
	const hiredByWage = new Map<number, number[]>();
	for (const person of plan.people) {
		if (person.role !== 'hired') continue;
		const wage = person.wageUsdPerHour ?? 0;
		const hours = hiredByWage.get(wage) ?? new Array<number>(12).fill(0);
		person.hoursAvailableByMonth.forEach((h, m) => (hours[m] += h));
		hiredByWage.set(wage, hours);
	}
	const hiredColumns = years.map(() => Array.from({ length: 12 }, () => [] as number[]));
	years.forEach((year, y) => {
		for (const [wage, hours] of hiredByWage) {
			for (let m = 0; m < 12; m++) {
				if (hours[m] <= 0) continue;
				hiredColumns[y][m].push(
					addColumn(
						{ kind: 'hired', wageUsdPerHour: wage, yearIndex: y, month: m },
						{
							name: `hired_at_${wage}_usd_${year}_${monthNumber(m)}`,
							// The budgets charge every hour at the labour rate, then a hired hour's wage in its place.
							cost: prices[y].labourUsdPerHour - wage + weights.familyLabourUsdPerHour,
							lower: 0,
							upper: hours[m],
							integer: false
						},
						years.map((_, i) => (i === y ? prices[y].labourUsdPerHour - wage : 0))
					)
				);
			}
		}
	});

	builder.offset = netReturnConstantUsdByYear.reduce((a, b) => a + b, 0);

	// Rows. Each field is farmed whole, split between its choices.
	plan.fields.forEach((field, fieldIndex) => {
		addRow(
			{ kind: 'field', fieldIndex },
			`field_${lpName(field.id)}`,
			{ lower: 1, upper: 1 },
			entriesOf(choicesByField[fieldIndex], () => 1)
		);
	});

	// Each month's work: the choices' field work, and chores (every season day a hay day, less what
	// grazing saves), the hay-day chores being the constant on the right.
	const familyHours =
		limits.familyLabourHoursByMonth ??
		(plan.people.length ? familyHoursByMonth(plan.people) : plan.farm.labourHoursAvailableByMonth);
	// Family hours: all the month's work less the hired hours (`sign` -1 for hired less work).
	const familyWork = (y: number, m: number, sign = 1, entries = new RowEntries()) => {
		entries.add(workColumns[y][m], sign);
		for (const column of hiredColumns[y][m]) entries.add(column, -sign);
		return entries;
	};
	years.forEach((year, y) => {
		for (let m = 0; m < 12; m++) {
			const work = addRow(
				{ kind: 'work', yearIndex: y, month: m },
				`work_in_${year}_${monthNumber(m)}`,
				{ lower: -baseChoreHours[y][m], upper: -baseChoreHours[y][m] },
				entriesOf(choices, (c) => c.years[y].labourHoursByMonth[m])
					.append(grazingColumns[y], (g) => (g.month === m ? -choreHoursSavedPerAuDay : 0))
					.add(workColumns[y][m], -1)
			);
			rowLimits[work] = baseChoreHours[y][m];
			addRow(
				{ kind: 'family-labour', yearIndex: y, month: m },
				`family_labour_${year}_${monthNumber(m)}`,
				{ upper: familyHours[m] },
				familyWork(y, m)
			);
			// No more hired hours than there is work: the rest would be paid for nothing.
			if (hiredColumns[y][m].length) {
				addRow(
					{ kind: 'hired-within-work', yearIndex: y, month: m },
					`hired_within_work_${year}_${monthNumber(m)}`,
					{ upper: 0 },
					familyWork(y, m, -1)
				);
			}
		}
		const span = limits.familyLabourSpan;
		if (span) {
			const months = [...new Set(span.months)].map((m) => m - 1);
			addRow(
				{ kind: 'family-span', yearIndex: y, months },
				`family_labour_span_${year}`,
				{ upper: span.maxHours },
				months.reduce((entries, m) => familyWork(y, m, 1, entries), new RowEntries())
			);
		}
		if (limits.nitrogenPurchasedLbPerYear !== null) {
			addRow(
				{ kind: 'nitrogen', yearIndex: y },
				`nitrogen_${year}`,
				{ upper: limits.nitrogenPurchasedLbPerYear },
				entriesOf(choices, (c) => c.years[y].nitrogenPurchasedLb)
			);
		}
		if (limits.dieselGallonsPerYear !== null) {
			addRow(
				{ kind: 'diesel', yearIndex: y },
				`diesel_${year}`,
				{ upper: limits.dieselGallonsPerYear },
				entriesOf(choices, (c) => c.years[y].dieselGallons)
			);
		}
	});

	// Crop limits, each year: acres between the least and the most (or share of the farm) allowed.
	const farmAcres = plan.fields.reduce((sum, f) => sum + f.acres, 0);
	const cropById = new Map(plan.crops.map((c) => [c.id, c]));
	for (const limit of limits.crops) {
		const shareAcres =
			limit.maxSharePercent === null ? Infinity : (limit.maxSharePercent / 100) * farmAcres;
		const upper = Math.min(limit.maxAcres ?? Infinity, shareAcres);
		const lower = limit.minAcres ?? -Infinity;
		if (upper === Infinity && lower === -Infinity) continue;
		const cropName = cropById.get(limit.cropId)!.name;
		years.forEach((year, y) => {
			addRow(
				{ kind: 'crop', cropId: limit.cropId, cropName, yearIndex: y },
				`crop_${lpName(limit.cropId)}_${year}`,
				{ lower, upper },
				entriesOf(choices, (c) =>
					c.years[y].cropId === limit.cropId ? plan.fields[c.fieldIndex].acres : 0
				)
			);
		});
	}

	// Forage: the herd eats what the fields offer, and hay makes up the rest of its demand.
	if (herd && units > 0) {
		const auDaysPerBale =
			(herd.baleWeightLb *
				(herd.baleDryMatterPercent / 100) *
				(1 - herd.feedingWastePercent / 100)) /
			herd.intakeLbDmPerAuDay;
		years.forEach((year, y) => {
			addRow(
				{ kind: 'grazing-offered', yearIndex: y },
				`grazing_offered_${year}`,
				{ upper: 0 },
				entriesOf(grazingColumns[y], () => 1).append(choices, (c) => -c.years[y].grazingAuDays)
			);
			addRow(
				{ kind: 'forage', yearIndex: y },
				`forage_${year}`,
				{ lower: units * herd.feedingSeasonDays },
				entriesOf(grazingColumns[y], () => 1).add(hayColumns[y], auDaysPerBale)
			);
		});
	}

	const assumptions = [
		"Each field's numbers come from the same budgets as a plan's: its N credits, residue and grazing follow the rotation it is given.",
		'Every hour of work is charged at the price set’s labour rate and a hired hour at its wage instead, as in the budgets; the family’s hours stop at what the people page gives them.'
	];
	if (eatenShare > 0) {
		assumptions.push(
			'Credits from grazing (manure, the grazed share of a legume cover) assume the herd eats all the forage the fields offer; where they offer more, the plan itself will show smaller credits.',
			'Chore hours are right for the year; by month, the model may place grazing days in another month of the feeding season than the plan (which grazes first, then feeds hay).'
		);
	}
	if (!options.wholeFields) {
		assumptions.push(
			'A field may be split between rotations: choose whole fields for one rotation on each.'
		);
	}
	const weighted = Object.values(weights).some((w) => w > 0);
	if (weighted) {
		assumptions.push(
			'The weights on hours, N, diesel and grazing change what is chosen and the objective, not the net return.'
		);
	}

	const model = builder.build();
	if (!isFinite(model)) {
		return {
			ok: false,
			issues: [
				{
					path: 'plan',
					message:
						'The plan gives a number too large to work with under some rotation: check its yields, prices and rates.'
				}
			]
		};
	}
	return {
		ok: true,
		farm: {
			model,
			plan,
			options,
			years,
			choices,
			columnRoles,
			rowRoles,
			netReturnUsdByColumnYear: netReturnByColumn.map((v) => Float64Array.from(v)),
			netReturnConstantUsdByYear,
			rowLimits,
			assumptions
		}
	};
}
