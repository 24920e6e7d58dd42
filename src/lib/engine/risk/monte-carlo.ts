// Monte Carlo of crop prices and yields: how a plan's net return spreads when each crop's price and
// yield move from year to year, and how often the plan beats the reference plan on the same draws.
import { randomLcg, randomNormal } from 'd3-random';
import { deviation, mean, quantile } from 'd3-array';
import type { PlanDocument } from '../../schemas/plan-file';
import { feedingYear } from '../forage';
import { evaluatePlan } from '../index';
import {
	defaultCropDistribution,
	type Comovement,
	type CropDistribution,
	type CropDistributionDefault
} from './distribution-defaults';

export {
	defaultComovement,
	defaultCropDistribution,
	type Comovement,
	type CropDistribution,
	type CropDistributionDefault
} from './distribution-defaults';

export interface MonteCarloOptions extends Comovement {
	draws: number;
	seed: number;
	/** One per crop the plans grow; a crop left out takes its default. */
	crops: CropDistribution[];
}

/** One crop's share of a plan year: what moves with its price and yield. */
interface CropYear {
	crop: string;
	/** Revenue at the plan's expected price and yield, $: it scales with price × yield. */
	revenueUsd: number;
	/** AU-days of grazing its residue offers: they scale with yield. */
	residueAuDays: number;
}

/** One year of a plan, reduced to what a price or yield draw changes. */
export interface RiskYear {
	year: number;
	crops: CropYear[];
	/** Every cost that a price or yield does not move: field costs, fixed costs, $. */
	fixedCostsUsd: number;
	/** Grazing offered by covers, which no crop's yield moves, AU-days. */
	coverAuDays: number;
	herd: PlanDocument['herd'];
	hayUsdPerBale: number;
	labourUsdPerHour: number;
	/** The year's net return as the plan states it, $ (a check: factors of 1 give it back). */
	netReturnUsd: number;
}

export interface RiskModel {
	name: string;
	startYear: number;
	years: RiskYear[];
	crops: string[];
}

/**
 * A plan reduced to the coefficients a price or yield draw acts on, from one evaluation. The N each
 * field gets is fixed at the plan's rate (it is bought before the year's price and yield are known),
 * and so is everything the N decides; revenue is then price × yield × acres for each field, and hay
 * follows the residue the crops leave. Not modelled: a yield that changes the manure the herd leaves
 * for the next crop (the N credit carried to the next year stays as planned).
 */
export function riskModel(doc: PlanDocument): RiskModel {
	const result = evaluatePlan(doc);
	const prices = new Map(doc.priceSets.map((p) => [p.year, p]));
	const intake = doc.herd?.intakeLbDmPerAuDay ?? 1;
	const crops = new Set<string>();
	const years = result.farmYears.map((farmYear): RiskYear => {
		const byCrop = new Map<string, CropYear>();
		let coverAuDays = 0;
		for (const fy of result.fieldYears) {
			if (fy.year !== farmYear.year) continue;
			crops.add(fy.crop);
			const cropYear = byCrop.get(fy.crop) ?? { crop: fy.crop, revenueUsd: 0, residueAuDays: 0 };
			cropYear.revenueUsd += fy.revenueUsd;
			if (doc.herd) {
				cropYear.residueAuDays += (fy.forage.residueLbDmPerAcre * fy.acres) / intake;
				coverAuDays += (fy.forage.coverLbDmPerAcre * fy.acres) / intake;
			}
			byCrop.set(fy.crop, cropYear);
		}
		const set = prices.get(farmYear.year)!;
		return {
			year: farmYear.year,
			crops: [...byCrop.values()],
			fixedCostsUsd: farmYear.fieldCostsUsd + farmYear.fixedCostsUsd,
			coverAuDays,
			herd: doc.herd,
			hayUsdPerBale: set.hayUsdPerBale,
			labourUsdPerHour: set.labourUsdPerHour,
			netReturnUsd: farmYear.netReturnUsd
		};
	});
	return {
		name: doc.plan.name,
		startYear: doc.plan.horizon.startYear,
		years,
		crops: [...crops].sort()
	};
}

/** A draw for one crop in one year: its price and yield as multiples of the plan's (1 = as planned). */
export interface DrawFactors {
	price: number;
	yield: number;
}

/**
 * A year's net return under a draw, $: crop revenue scaled by price × yield, hay bought for what the
 * grazing does not cover (residue scales with yield), chores at the year's labour rate, fixed costs.
 * A crop missing from `factors` stays as planned.
 */
export function yearNetReturnUsd(year: RiskYear, factors: Map<string, DrawFactors>): number {
	let revenueUsd = 0;
	let grazingAuDays = year.coverAuDays;
	for (const c of year.crops) {
		const f = factors.get(c.crop);
		revenueUsd += c.revenueUsd * (f ? f.price * f.yield : 1);
		grazingAuDays += c.residueAuDays * (f ? f.yield : 1);
	}
	let herdUsd = 0;
	if (year.herd) {
		const feeding = feedingYear(year.herd, grazingAuDays);
		herdUsd = feeding.hayBales * year.hayUsdPerBale + feeding.choreHours * year.labourUsdPerHour;
	}
	return revenueUsd - year.fixedCostsUsd - herdUsd;
}

/** Mean, spread and percentiles of one quantity over the draws, $. */
export interface Spread {
	meanUsd: number;
	standardDeviationUsd: number;
	percentilesUsd: { p5: number; p25: number; p50: number; p75: number; p95: number };
	/** Share of draws below zero, 0 to 1. */
	lossProbability: number;
}

export interface PlanRisk {
	name: string;
	byYear: (Spread & { year: number; plannedUsd: number })[];
	/** The average net return a year over the plan's years. */
	horizonAverage: Spread & { plannedUsd: number };
	/** Share of all draw-years that lose money: the chance that a given year is a loss year. */
	lossYearProbability: number;
	/** Share of draws with at least one loss year in the horizon. */
	anyLossYearProbability: number;
	/** Net returns a year over the horizon of each draw, in ranges for a histogram. */
	histogram: { fromUsd: number; toUsd: number; draws: number }[];
}

export interface MonteCarloResult {
	draws: number;
	seed: number;
	/** Each crop's distribution as drawn, with where its numbers come from ('as entered' when stated). */
	distributions: CropDistributionDefault[];
	comovement: Comovement;
	plan: PlanRisk;
	reference: PlanRisk | null;
	/** Share of draws in which the plan's average net return beats the reference plan's (same draws). */
	beatsReferenceProbability: number | null;
}

/** Drawn factors are held at or above zero: a negative price or yield has no meaning. */
const atLeastZero = (x: number) => (x > 0 ? x : 0);

const histogramBins = 30;

/** Percentiles interpolated between order statistics (R's default, type 7), and the sample (n − 1) SD. */
function spread(values: number[]): Spread {
	const [p5, p25, p50, p75, p95] = [0.05, 0.25, 0.5, 0.75, 0.95].map(
		(p) => quantile(values, p) ?? 0
	);
	return {
		meanUsd: mean(values) ?? 0,
		standardDeviationUsd: deviation(values) ?? 0,
		percentilesUsd: { p5, p25, p50, p75, p95 },
		lossProbability: values.filter((v) => v < 0).length / values.length
	};
}

/** The lowest and highest of several lists, for histograms that share their ranges. */
function extent(lists: number[][]): [number, number] {
	let low = Infinity;
	let high = -Infinity;
	for (const values of lists) {
		for (const v of values) {
			if (v < low) low = v;
			if (v > high) high = v;
		}
	}
	return [low, high];
}

function histogram(values: number[], [low, high]: [number, number]) {
	const width = high > low ? (high - low) / histogramBins : 1;
	const counts = new Array<number>(histogramBins).fill(0);
	for (const v of values) counts[Math.min(Math.floor((v - low) / width), histogramBins - 1)]++;
	return counts.map((draws, i) => ({
		fromUsd: low + i * width,
		toUsd: low + (i + 1) * width,
		draws
	}));
}

/**
 * A seeded Monte Carlo of one plan (and the reference plan on the same draws). `step(n)` draws the next
 * `n` (so a job can report progress and yield between steps); the answer depends only on the seed and
 * the options, never on how the draws were stepped.
 */
export function createMonteCarlo(
	plan: RiskModel,
	reference: RiskModel | null,
	options: MonteCarloOptions
) {
	const crops = [...new Set([...plan.crops, ...(reference?.crops ?? [])])].sort();
	const stated = new Map(options.crops.map((c) => [c.crop, c]));
	const distributions: CropDistributionDefault[] = crops.map((crop) => {
		const own = stated.get(crop);
		return own ? { ...own, source: 'as entered' } : defaultCropDistribution(crop);
	});
	const compared =
		reference !== null &&
		reference.years.length === plan.years.length &&
		reference.startYear === plan.startYear;
	const yearCount = plan.years.length;
	const { draws } = options;
	const normal = randomNormal.source(randomLcg(options.seed))(0, 1);
	const weather = Math.sqrt(options.sharedWeather);
	const ownWeather = Math.sqrt(1 - options.sharedWeather);
	const market = Math.sqrt(options.sharedMarket);
	const ownMarket = Math.sqrt(1 - options.sharedMarket);
	const planNet = plan.years.map(() => new Float64Array(draws));
	const referenceNet = compared ? reference.years.map(() => new Float64Array(draws)) : [];
	const factors = new Map<string, DrawFactors>(crops.map((crop) => [crop, { price: 1, yield: 1 }]));
	let done = 0;

	function drawYear() {
		const weatherShock = normal();
		const marketShock = normal();
		for (const d of distributions) {
			const yieldZ = weather * weatherShock + ownWeather * normal();
			const marketZ = market * marketShock + ownMarket * normal();
			const r = d.priceYieldCorrelation;
			const priceZ = r * yieldZ + Math.sqrt(1 - r * r) * marketZ;
			const f = factors.get(d.crop)!;
			f.yield = atLeastZero(1 + (d.yieldCvPercent / 100) * yieldZ);
			f.price = atLeastZero(1 + (d.priceCvPercent / 100) * priceZ);
		}
	}

	return {
		total: draws,
		get done() {
			return done;
		},
		/** Draws the next `count` draws (fewer at the end); answers how many are done. */
		step(count: number): number {
			const end = Math.min(done + count, draws);
			for (; done < end; done++) {
				for (let y = 0; y < yearCount; y++) {
					drawYear();
					planNet[y][done] = yearNetReturnUsd(plan.years[y], factors);
					if (compared) referenceNet[y][done] = yearNetReturnUsd(reference.years[y], factors);
				}
			}
			return done;
		},
		result(): MonteCarloResult {
			if (done < draws) throw new Error('The Monte Carlo has not drawn every draw yet.');
			const planAverage = averageByDraw(planNet);
			const referenceAverage = compared ? averageByDraw(referenceNet) : null;
			// One set of ranges for both plans, so their histograms can be read against each other.
			const range = extent(referenceAverage ? [planAverage, referenceAverage] : [planAverage]);
			const planRisk = summarise(plan, planNet, planAverage, range);
			const referenceRisk =
				compared && referenceAverage
					? summarise(reference, referenceNet, referenceAverage, range)
					: null;
			let wins = 0;
			if (compared) {
				for (let d = 0; d < draws; d++) {
					let difference = 0;
					for (let y = 0; y < yearCount; y++) difference += planNet[y][d] - referenceNet[y][d];
					if (difference > 0) wins++;
				}
			}
			return {
				draws,
				seed: options.seed,
				distributions,
				comovement: { sharedWeather: options.sharedWeather, sharedMarket: options.sharedMarket },
				plan: planRisk,
				reference: referenceRisk,
				beatsReferenceProbability: compared ? wins / draws : null
			};
		}
	};
}

/** Each draw's average net return a year over the horizon. */
function averageByDraw(net: Float64Array[]): number[] {
	const draws = net[0]?.length ?? 0;
	const average = new Array<number>(draws).fill(0);
	for (const year of net) for (let d = 0; d < draws; d++) average[d] += year[d] / net.length;
	return average;
}

function summarise(
	model: RiskModel,
	net: Float64Array[],
	average: number[],
	range: [number, number]
): PlanRisk {
	const draws = average.length;
	let lossYears = 0;
	let anyLoss = 0;
	for (let d = 0; d < draws; d++) {
		let lost = false;
		for (const year of net) {
			if (year[d] < 0) {
				lossYears++;
				lost = true;
			}
		}
		if (lost) anyLoss++;
	}
	const planned = model.years.reduce((sum, y) => sum + y.netReturnUsd, 0) / model.years.length;
	return {
		name: model.name,
		byYear: model.years.map((y, i) => ({
			year: y.year,
			plannedUsd: y.netReturnUsd,
			...spread(Array.from(net[i]))
		})),
		horizonAverage: { plannedUsd: planned, ...spread(average) },
		lossYearProbability: lossYears / (draws * net.length),
		anyLossYearProbability: anyLoss / draws,
		histogram: histogram(average, range)
	};
}

/** Every draw at once, with `onProgress(done, total)` after each step (tests and the bench). */
export function runMonteCarlo(
	plan: RiskModel,
	reference: RiskModel | null,
	options: MonteCarloOptions,
	onProgress?: (done: number, total: number) => void
): MonteCarloResult {
	const run = createMonteCarlo(plan, reference, options);
	const stepSize = Math.max(Math.ceil(run.total / 20), 1);
	while (run.done < run.total) {
		run.step(stepSize);
		onProgress?.(run.done, run.total);
	}
	return run.result();
}
