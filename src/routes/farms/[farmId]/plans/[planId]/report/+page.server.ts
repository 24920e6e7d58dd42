import { error } from '@sveltejs/kit';
import { evaluatePlan, NonFiniteResultError, summarisePlan } from '$lib/engine';
import { breakEven } from '$lib/engine/risk/break-even';
import type { CashFlow } from '$lib/engine/risk/cash-flow';
import { sensitivity } from '$lib/engine/risk/sensitivity';
import { resultsQuerySchema } from '$lib/schemas/plans';
import type { PlanDocument } from '$lib/schemas/plan-file';
import { defaultSensitivitySteps, type CashFlowSettings } from '$lib/schemas/risk';
import { requirePlanAccess } from '$lib/server/auth/access';
import { displayUnits, shownScales } from '$lib/server/display-units';
import { db } from '$lib/server/db';
import { findCashFlowSettings } from '$lib/server/db/cash-flow';
import { findReferencePlan, listPlanVersions } from '$lib/server/db/plans';
import { listReviewEntries, notShared, statesByVersion } from '$lib/server/db/reviews';
import type { MonteCarloJobResult } from '$lib/server/jobs/monte-carlo';
import { findNewestCompletedJob } from '$lib/server/jobs/queue';
import { evaluateStoredPlan } from '$lib/server/plan-report';
import { planCashFlow, shownBreakEven } from '$lib/server/risk';
import type { PageServerLoad } from './$types';

// The printable report of one plan version: everything a lender files with a credit decision.
export const load = (async (event) => {
	const { farm, plan } = await requirePlanAccess(
		event,
		event.params.farmId,
		event.params.planId,
		'farm:view'
	);
	const asked = resultsQuerySchema
		.pick({ version: true })
		.safeParse({ version: event.url.searchParams.get('version') ?? undefined });
	if (!asked.success) error(404, 'No such version of this plan.');
	const version = asked.data.version ?? plan.currentVersion;
	const referencePlan = await findReferencePlan(db, farm.id);
	const [evaluation, versions, entries, cashFlowSettings, monteCarloJob] = await Promise.all([
		evaluateStoredPlan(db, farm, plan, version, referencePlan ?? null),
		listPlanVersions(db, plan.id),
		listReviewEntries(db, plan.id),
		findCashFlowSettings(db, farm.id),
		findNewestCompletedJob('monte-carlo', plan.id, version)
	]);
	const saved = versions.find((v) => v.version === version);
	if (!saved) error(404, `This plan has no version ${version}.`);
	const states = statesByVersion(entries);
	const base = {
		farm: { id: farm.id, name: farm.name, region: farm.region, unitSystem: farm.unitSystem },
		plan: {
			id: plan.id,
			name: plan.name,
			isReference: plan.isReference,
			currentVersion: plan.currentVersion
		},
		version: { ...saved, review: states.get(version) ?? notShared },
		referencePlanName: referencePlan && referencePlan.id !== plan.id ? referencePlan.name : null,
		review: {
			states: versions.map((v) => ({
				version: v.version,
				...(states.get(v.version) ?? notShared)
			})),
			entries: entries.toReversed()
		},
		scales: shownScales(farm.unitSystem),
		printedAt: new Date()
	};
	if (!evaluation.ok) return { ...base, report: null, problem: evaluation.message };
	const { document, summary, reference } = evaluation;
	const show = displayUnits(farm.unitSystem);
	const practiceNames = new Map(document.practices.map((p) => [p.id, p.name]));
	const rotationNames = new Map(document.rotations.map((r) => [r.id, r.name]));
	return {
		...base,
		problem: null,
		report: {
			summary,
			referenceSummary: reference && summarisePlan(evaluatePlan(reference.document)),
			grid: summary.fields.map((field) => ({
				key: field.fieldId,
				name: field.fieldName,
				area: show.amount(field.acres, 'area')!,
				rotation: rotationNames.get(field.rotationId) ?? field.rotationId,
				practices: field.practiceIdByYear.map((id) => practiceNames.get(id) ?? id)
			})),
			herdHead: document.herd?.head ?? null,
			assumptions: document.plan.assumptions,
			notes: document.notes ?? ''
		},
		risk: riskOf(document, cashFlowSettings),
		monteCarlo: monteCarloOf(monteCarloJob, version)
	};
}) satisfies PageServerLoad;

// The sensitivity evaluates the plan some 120 times (about 2 s at 100 fields): beyond this many fields
// the report leaves it out rather than hold the server, and says so.
const sensitivityFieldLimit = 300;

/** Break-even, sensitivity and cash flow of the version's plan file, as the risk pages work them out. */
function riskOf(document: PlanDocument, settings: CashFlowSettings) {
	try {
		const result = evaluatePlan(document);
		const tooMany = document.fields.length > sensitivityFieldLimit;
		return {
			ok: true as const,
			breakEven: shownBreakEven(breakEven(result), document),
			sensitivity: tooMany ? null : sensitivity(document, defaultSensitivitySteps),
			sensitivityFieldLimit,
			cashFlow: peaks(planCashFlow(document, settings, result)),
			cashFlowSettings: settings
		};
	} catch (err) {
		if (!(err instanceof NonFiniteResultError)) throw err;
		return { ok: false as const };
	}
}

/** What the report shows of a cash flow: each year's peak and its settings, not every month's lines. */
function peaks(flow: CashFlow) {
	return {
		startingCashUsd: flow.startingCashUsd,
		minimumBalanceUsd: flow.minimumBalanceUsd,
		interestRatePercent: flow.interestRatePercent,
		peakLoanUsd: flow.peakLoanUsd,
		peakLoan: flow.peakLoan,
		loanInterestUsd: flow.loanInterestUsd,
		saleMonths: flow.saleMonths.map((s) => ({
			crop: s.crop,
			cropName: s.cropName,
			setMonth: s.setMonth,
			saleMonths: [...new Set(s.years.map((y) => y.saleMonth))]
		})),
		years: flow.years.map((y) => ({
			year: y.year,
			peakLoanUsd: y.peakLoanUsd,
			peakLoanMonth: y.peakLoanMonth,
			loanInterestUsd: y.loanInterestUsd,
			closingBalanceUsd: y.closingBalanceUsd,
			closingLoanUsd: y.closingLoanUsd,
			loanByMonthUsd: y.months.map((m) => m.loanBalanceUsd)
		}))
	};
}

/**
 * The plan's newest finished Monte Carlo run of this version; when there is none, the version of the
 * plan's newest run of another version (null: no run at all).
 */
function monteCarloOf(job: Awaited<ReturnType<typeof findNewestCompletedJob>>, version: number) {
	const output = job?.output as MonteCarloJobResult | undefined;
	if (!job || !output) return { result: null, completedAt: null, otherVersion: null };
	if (output.planVersion !== version) {
		return { result: null, completedAt: null, otherVersion: output.planVersion };
	}
	return { result: output, completedAt: job.completedOn, otherVersion: null };
}
