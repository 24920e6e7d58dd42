import type { CropPractice, PlanAdjustment } from '../schemas/plan-file';

/** What a plan's adjustments change for one field-year: N added to the rate, and the yield's scale. */
export interface FieldYearAdjustment {
	nitrogenChangeLbPerAcre: number;
	/** Multiplies the yield: 0.9 for "10 % lower". */
	yieldFactor: number;
}

/**
 * Every adjustment that names this field, this practice, both or neither applies: N changes add up,
 * yield changes compound (two 10 % cuts are 19 %, as two separate causes of loss would be).
 */
export function adjustmentFor(
	adjustments: PlanAdjustment[],
	fieldId: string,
	practiceId: string
): FieldYearAdjustment {
	let nitrogenChangeLbPerAcre = 0;
	let yieldFactor = 1;
	for (const a of adjustments) {
		if (a.fieldId !== undefined && a.fieldId !== fieldId) continue;
		if (a.practiceId !== undefined && a.practiceId !== practiceId) continue;
		nitrogenChangeLbPerAcre += a.nitrogenChangeLbPerAcre;
		yieldFactor *= 1 + a.yieldChangePercent / 100;
	}
	return { nitrogenChangeLbPerAcre, yieldFactor };
}

/** The practice as this field-year runs it: its own yield adjustment with the plan's on top. */
export function adjustedPractice(
	practice: CropPractice,
	adjustment: FieldYearAdjustment
): CropPractice {
	if (adjustment.yieldFactor === 1) return practice;
	const factor = (1 + practice.yieldAdjustmentPercent / 100) * adjustment.yieldFactor;
	return { ...practice, yieldAdjustmentPercent: (factor - 1) * 100 };
}
