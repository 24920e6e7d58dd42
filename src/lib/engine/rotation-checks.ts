/**
 * Warnings about a rotation as a whole: things a practice states that its place in the rotation does
 * not fit. A rotation repeats, so its first year follows its last (a one-year rotation follows itself).
 * Only what a practice states is checked: its crop, its N rate, the N credit it leaves and its cover mix.
 * These are warnings, not refusals: a farm may have its reasons.
 */
import { legumeCoverCreditLbPerAcre } from './nitrogen';

export interface RotationYear {
	practiceName: string;
	crop: { id: string; name: string; legume: boolean; soldBy: string };
	nitrogenAppliedLbPerAcre: number | 'economic-optimum';
	nitrogenCreditToNextCropLbPerAcre: number;
	coverMix: {
		biomassLbDmPerAcre: number;
		legumeSharePercent: number;
		legumeNitrogenPercent: number;
		nitrogenAvailablePercent: number;
		grazingUtilisationPercent: number;
	} | null;
}

export type RotationRule = 'corn-after-corn' | 'same-crop' | 'corn-short-of-n' | 'credit-to-legume';

export interface RotationWarning {
	/** 1 = the rotation's first year. */
	year: number;
	rule: RotationRule;
	message: string;
}

/**
 * The bottom of the N range Iowa State (PM 1714) gives for corn after soybean, lb N/ac; corn after
 * corn needs more (Iowa MRTN 181 vs 124 lb N/ac at a 0.10 price ratio; REFERENCE-VALUES §4a).
 */
export const cornAfterSoybeanMinLbN = 100;

/**
 * A credit too small to plan around: under 10 lb N/ac is inside the error of any credit estimate
 * (common practice, no published source).
 */
export const minCreditWorthNotingLbN = 10;

/** The N credit a year leaves for the next: the stated prior-crop credit and its legume cover's. */
export function creditLeftLbPerAcre(year: RotationYear): number {
	const cover = year.coverMix;
	const coverCredit = cover
		? legumeCoverCreditLbPerAcre(
				cover.biomassLbDmPerAcre,
				cover.legumeSharePercent,
				cover.legumeNitrogenPercent,
				cover.nitrogenAvailablePercent,
				cover.grazingUtilisationPercent
			)
		: 0;
	return year.nitrogenCreditToNextCropLbPerAcre + coverCredit;
}

const lb = (n: number) => `${Math.round(n).toLocaleString('en-US')} lb N/ac`;

export function checkRotation(years: readonly RotationYear[]): RotationWarning[] {
	const warnings: RotationWarning[] = [];
	years.forEach((year, i) => {
		const before = years[(i + years.length - 1) % years.length];
		const warn = (rule: RotationRule, message: string) =>
			warnings.push({ year: i + 1, rule, message });
		const credit = creditLeftLbPerAcre(before);
		const sameCrop = before.crop.id === year.crop.id;

		if (sameCrop && year.crop.id === 'corn') {
			// Iowa MRTN: 181 lb N/ac for corn after corn, 124 after soybean (ISU ICM, REFERENCE-VALUES §4a).
			warn(
				'corn-after-corn',
				`Corn follows corn: corn after corn needs more N than corn after soybean (Iowa State's MRTN is 181 against 124 lb N/ac) and often yields less; check the yield goal and N of “${year.practiceName}”.`
			);
		} else if (sameCrop && year.crop.soldBy === 'bu') {
			// Common practice, no published source: a grain crop after itself carries its diseases and pests over.
			warn(
				'same-crop',
				`${year.crop.name} follows ${year.crop.name}: a crop after itself carries its diseases and pests over; check the yield goal of “${year.practiceName}”.`
			);
		}

		const applied = year.nitrogenAppliedLbPerAcre;
		if (year.crop.id === 'corn' && applied !== 'economic-optimum') {
			if (applied + credit < cornAfterSoybeanMinLbN) {
				const from = credit > 0 ? ` and ${lb(credit)} left by “${before.practiceName}”` : '';
				warn(
					'corn-short-of-n',
					`“${year.practiceName}” gets ${lb(applied + credit)} (${lb(applied)} applied${from}): less than the ${cornAfterSoybeanMinLbN} lb N/ac at the bottom of Iowa State's range for corn after soybean. A low rate that counts on a legume credit needs a legume the year before.`
				);
			}
		}

		if (year.crop.legume && credit >= minCreditWorthNotingLbN) {
			// Common practice, no published source: a legume fixes its own N, so a credit left to it is not used.
			warn(
				'credit-to-legume',
				`“${before.practiceName}” leaves ${lb(credit)} for ${year.crop.name}, a legume that fixes its own N: a crop that needs N would use it.`
			);
		}
	});
	return warnings;
}
