import { error, fail, redirect } from '@sveltejs/kit';
import { NonFiniteResultError } from '$lib/engine';
import type { CashFlow } from '$lib/engine/risk/cash-flow';
import { toFieldErrors } from '$lib/schemas/issues';
import { cashFlowSettingsSchema, type CashFlowSettings } from '$lib/schemas/risk';
import { requirePlanAccess, roleAllows } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { findCashFlowSettings, saveCashFlowSettings } from '$lib/server/db/cash-flow';
import { findPlan, listPlansByFarm, type PlanRow } from '$lib/server/db/plans';
import { storedPlanDocument } from '$lib/server/plans';
import { planCashFlow } from '$lib/server/risk';
import type { Actions, PageServerLoad } from './$types';

// The plan's monthly cash flow and operating loan, for anyone who may view the farm; `?year=` picks the
// year shown month by month, `?against=<plan id>` a plan whose peak loan stands beside this one's.
// Owners and editors change the farm's cash-flow settings here.
export const load = (async (event) => {
	const { farm, role, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const [settings, plans] = await Promise.all([
		findCashFlowSettings(db, farm.id),
		listPlansByFarm(db, farm.id)
	]);
	const flow = await cashFlowOf(farm, plan, settings);
	if (!flow) {
		error(
			422,
			'This plan does not make a valid plan on the farm as it stands: open it to see why.'
		);
	}
	const years = flow.years.map((y) => y.year);
	const askedYear = Number(event.url.searchParams.get('year'));
	const year = years.includes(askedYear) ? askedYear : years[0];

	const againstId = event.url.searchParams.get('against');
	const againstPlan =
		againstId && againstId !== plan.id ? await findPlan(db, farm.id, againstId) : undefined;
	const againstFlow = againstPlan ? await cashFlowOf(farm, againstPlan, settings) : undefined;

	return {
		farm: { id: farm.id, name: farm.name, interestRatePercent: farm.interestRatePercent },
		plan: { id: plan.id, name: plan.name, version: plan.currentVersion },
		canEdit: roleAllows(role, 'farm:edit'),
		settings,
		year,
		cashFlow: {
			...peaks(flow),
			saleMonths: flow.saleMonths,
			shown: flow.years.find((y) => y.year === year)!
		},
		otherPlans: plans
			.filter((p) => p.id !== plan.id)
			.map((p) => ({ id: p.id, name: p.name, isReference: p.isReference })),
		against: againstPlan
			? {
					id: againstPlan.id,
					name: againstPlan.name,
					// null: that plan does not evaluate on the farm as it stands.
					cashFlow: againstFlow ? peaks(againstFlow) : null
				}
			: null
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { user, farm, plan } = await requirePlanAccess(
			event,
			event.params.farmId,
			event.params.planId,
			'farm:edit'
		);
		const [form, saved] = await Promise.all([
			event.request.formData(),
			findCashFlowSettings(db, farm.id)
		]);
		const input = settingsFromForm(form, saved);
		const parsed = cashFlowSettingsSchema.safeParse(input);
		if (!parsed.success) {
			return fail(400, { values: formValues(form), errors: toFieldErrors(parsed.error) });
		}
		await saveCashFlowSettings(db, farm.id, user.id, parsed.data);
		redirect(303, `/farms/${farm.id}/plans/${plan.id}/cash-flow${event.url.search}`);
	}
} satisfies Actions;

type Farm = Parameters<typeof storedPlanDocument>[1];

/** A plan's cash flow under the settings; undefined when the plan does not evaluate. */
async function cashFlowOf(farm: Farm, plan: PlanRow, settings: CashFlowSettings) {
	const stored = await storedPlanDocument(db, farm, plan);
	if (!stored.ok) return undefined;
	try {
		return planCashFlow(stored.document, settings);
	} catch (err) {
		if (err instanceof NonFiniteResultError) return undefined;
		throw err;
	}
}

/** What the peak-loan comparison needs of a plan's cash flow: every year's summary, not its months. */
function peaks(flow: CashFlow) {
	return {
		peakLoanUsd: flow.peakLoanUsd,
		peakLoan: flow.peakLoan,
		loanInterestUsd: flow.loanInterestUsd,
		years: flow.years.map((y) => ({
			year: y.year,
			peakLoanUsd: y.peakLoanUsd,
			peakLoanMonth: y.peakLoanMonth,
			loanInterestUsd: y.loanInterestUsd,
			closingBalanceUsd: y.closingBalanceUsd,
			closingLoanUsd: y.closingLoanUsd
		}))
	};
}

/** A form's text as a number; text that is not one stays text, so the schema names it. */
function formNumber(value: FormDataEntryValue | null): unknown {
	if (value === null) return undefined;
	const text = String(value).trim();
	if (text === '') return undefined;
	const parsed = Number(text.replace(/[,$]/g, ''));
	return Number.isFinite(parsed) ? parsed : text;
}

/**
 * The form as settings: `saleMonth:<crop>` is a month or empty (at harvest). Crops this plan does not
 * grow keep the sale months saved for them.
 */
function settingsFromForm(form: FormData, saved: CashFlowSettings) {
	const onForm = new Map<string, unknown>();
	for (const [key, value] of form) {
		if (key.startsWith('saleMonth:')) onForm.set(key.slice('saleMonth:'.length), formNumber(value));
	}
	const kept = saved.saleMonths.filter((s) => !onForm.has(s.crop));
	const set = [...onForm].flatMap(([crop, month]) =>
		month === undefined ? [] : [{ crop, month }]
	);
	return {
		startingCashUsd: formNumber(form.get('startingCashUsd')),
		minimumBalanceUsd: formNumber(form.get('minimumBalanceUsd')),
		saleMonths: [...kept, ...set]
	};
}

/** The form's own text, to put back in the inputs beside the messages. */
function formValues(form: FormData): Record<string, string> {
	const values: Record<string, string> = {};
	for (const [key, value] of form) values[key] = String(value);
	return values;
}
