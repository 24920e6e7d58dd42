// Monte Carlo of crop prices and yields: how a plan's net return spreads when each crop's price and
// yield move from year to year, and how often the plan beats the reference plan on the same draws.
import { randomLcg, randomNormal } from 'd3-random';
import { mean, quantileSeq, std } from 'mathjs';
import type { PlanDocument } from '../../schemas/plan-file';
import { feedingYear } from '../forage';
import { evaluatePlan } from '../index';

/**
 * How one crop's yield and price move around the plan's numbers. Yield and price are each drawn as
 * normal around the plan's expected value (the yield the plan computes, the price of the year's price
 * set), with a coefficient of variation (standard deviation ÷ mean), and the two are correlated.
 */
export interface CropDistribution {
	crop: string;
	yieldCvPercent: number;
	priceCvPercent: number;
	/** Correlation of the crop's price with its own yield, −1 to 1 (negative: a short crop sells dear). */
	priceYieldCorrelation: number;
}

export interface CropDistributionDefault extends CropDistribution {
	/** Where the numbers come from, in words a reader can check. */
	source: string;
}

const memory = 'from memory, not re-read: verify against your county before relying on them';
const noSource = 'common practice, no published source';

/**
 * Defaults by built-in crop. Yield CVs are farm-level, year to year (a farm's yields vary more than
 * its county's); price CVs are the spread of the harvest price around the price expected at planting.
 * Farm-level corn and soybean yield CVs of about 15 % and 12 % in the Corn Belt: Univ. of Illinois
 * farmdoc crop-insurance articles (Schnitkey) on farm yield variability, from memory. Price CVs of
 * about 20 % (corn) and 16 % (soybean): the USDA RMA price volatility factors for revenue insurance,
 * which have run about 0.15–0.30, from memory. Price–yield correlation negative (the "natural hedge"
 * of revenue insurance: a short crop raises the price), about −0.3 for corn and −0.2 for soybean at
 * farm level, weaker than at national level: farmdoc and extension risk-management material, from
 * memory. Small grains and forages: common practice, no published source.
 */
const cropDefaults = new Map<string, Omit<CropDistributionDefault, 'crop'>>([
	[
		'corn',
		{
			yieldCvPercent: 15,
			priceCvPercent: 20,
			priceYieldCorrelation: -0.3,
			source: `farmdoc (Univ. of Illinois) farm yield variability; USDA RMA price volatility factors — ${memory}`
		}
	],
	[
		'soybean',
		{
			yieldCvPercent: 12,
			priceCvPercent: 16,
			priceYieldCorrelation: -0.2,
			source: `farmdoc (Univ. of Illinois) farm yield variability; USDA RMA price volatility factors — ${memory}`
		}
	],
	[
		'wheat',
		{
			yieldCvPercent: 18,
			priceCvPercent: 20,
			priceYieldCorrelation: -0.2,
			source: `USDA RMA price volatility factors for wheat — ${memory}; yield CV ${noSource}`
		}
	]
]);

const otherCrop = {
	yieldCvPercent: 20,
	priceCvPercent: 15,
	priceYieldCorrelation: -0.2,
	source: noSource
};

export function defaultCropDistribution(crop: string): CropDistributionDefault {
	return { crop, ...(cropDefaults.get(crop) ?? otherCrop) };
}

/**
 * How the crops move together within a year. Each crop's yield shock is a shared weather shock plus
 * its own (`sharedWeather` is the correlation of two crops' yields); prices likewise share a market
 * shock (`sharedMarket` is the correlation of two crops' prices before each is tied to its own yield).
 * Years are drawn independently of each other.
 */
export interface Comovement {
	sharedWeather: number;
	sharedMarket: number;
}

/**
 * Corn and soybean yields on one farm move together (same weather) and so do their prices (one feed
 * grain market): correlations of about 0.5 and 0.6 — from memory of Corn Belt farm records, not re-read.
 */
export const defaultComovement: Comovement = { sharedWeather: 0.5, sharedMarket: 0.6 };

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

function spread(values: number[]): Spread {
	const [p5, p25, p50, p75, p95] = quantileSeq(values, [0.05, 0.25, 0.5, 0.75, 0.95]) as number[];
	return {
		meanUsd: Number(mean(values)),
		standardDeviationUsd: values.length > 1 ? Number(std(values)) : 0,
		percentilesUsd: { p5, p25, p50, p75, p95 },
		lossProbability: values.filter((v) => v < 0).length / values.length
	};
}

function histogram(values: number[]) {
	let low = Infinity;
	let high = -Infinity;
	for (const v of values) {
		if (v < low) low = v;
		if (v > high) high = v;
	}
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
			const planRisk = summarise(plan, planNet);
			const referenceRisk = compared ? summarise(reference, referenceNet) : null;
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

function summarise(model: RiskModel, net: Float64Array[]): PlanRisk {
	const draws = net[0]?.length ?? 0;
	const average = new Array<number>(draws).fill(0);
	let lossYears = 0;
	let anyLoss = 0;
	for (let d = 0; d < draws; d++) {
		let lost = false;
		for (const year of net) {
			average[d] += year[d] / net.length;
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
		histogram: histogram(average)
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
