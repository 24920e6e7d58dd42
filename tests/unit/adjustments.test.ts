// A plan's adjustments: an N rate change and a yield change for a practice, a field, both or every
// field, on top of the practices as stated.
import { describe, expect, it } from 'vitest';
import { evaluatePlan } from '../../src/lib/engine';
import { parsePlanDocument, type PlanDocumentInput } from '../../src/lib/schemas/plan-file';
import { oneCornFieldInput, smallPlanInput } from './fixtures';

function evaluated(input: PlanDocumentInput) {
	const parsed = parsePlanDocument(input);
	if (!parsed.ok) throw new Error(JSON.stringify(parsed.issues));
	return evaluatePlan(parsed.plan);
}

/** One corn field at a stated 150 lb N/ac (invented test numbers), with the given adjustments. */
function cornAt150(adjustments: NonNullable<PlanDocumentInput['plan']['adjustments']>) {
	const input = oneCornFieldInput();
	input.practices[0].nitrogen = { appliedLbPerAcre: 150 };
	input.plan.adjustments = adjustments;
	return evaluated(input).fieldYears[0];
}

describe('plan adjustments', () => {
	it('an N change moves the rate applied, the N bought and its cost, and never goes below zero', () => {
		const stated = cornAt150([]);
		const lower = cornAt150([{ nitrogenChangeLbPerAcre: -30 }]);
		expect(stated.nitrogen.appliedLbPerAcre).toBe(150);
		expect(lower.nitrogen.appliedLbPerAcre).toBe(120);
		expect(lower.nitrogen.purchasedLb).toBe(120 * lower.acres);
		// The N bill falls by the pounds not bought at the year's N price.
		const nPrice = stated.directCosts.nitrogenUsd / stated.nitrogen.purchasedLb;
		expect(stated.directCosts.nitrogenUsd - lower.directCosts.nitrogenUsd).toBeCloseTo(
			30 * lower.acres * nPrice,
			6
		);
		expect(cornAt150([{ nitrogenChangeLbPerAcre: -300 }]).nitrogen.appliedLbPerAcre).toBe(0);
	});

	it('with a response curve, the yield follows Y = a + bN − cN² at the N the change leaves', () => {
		// The quadratic form of corn's N response (Cerrato & Blackmer 1990, Agron. J. 82:138; recalled
		// from memory); the coefficients are the fixture's own invented ones.
		const input = smallPlanInput();
		input.plan.adjustments = [{ practiceId: 'corn', nitrogenChangeLbPerAcre: -40 }];
		const { a, b, c } = { a: 115, b: 0.85, c: 0.0025 };
		const curve = (n: number) => a + b * n - c * n * n;
		const plateau = curve(b / (2 * c));
		for (const fy of evaluated(input).fieldYears.filter((f) => f.crop === 'corn')) {
			const optimumLess = Math.max(
				fy.nitrogen.economicOptimumLbPerAcre! -
					fy.nitrogen.priorCropCreditLbPerAcre -
					fy.nitrogen.coverCreditLbPerAcre -
					fy.nitrogen.manureCreditLbPerAcre -
					40,
				0
			);
			expect(fy.nitrogen.appliedLbPerAcre).toBeCloseTo(optimumLess, 9);
			expect(fy.nitrogen.responseFactor).toBeCloseTo(
				curve(fy.nitrogen.availableLbPerAcre) / plateau,
				9
			);
		}
	});

	it('a yield change applies to the field it names only, and two changes compound', () => {
		const input = smallPlanInput();
		const plain = evaluated(input).fieldYears;
		input.plan.adjustments = [
			{ fieldId: 'east', yieldChangePercent: -10 },
			{ fieldId: 'east', practiceId: 'soy', yieldChangePercent: -10 }
		];
		const adjusted = evaluated(input).fieldYears;
		adjusted.forEach((fy, i) => {
			const factor = fy.fieldId !== 'east' ? 1 : fy.practiceId === 'soy' ? 0.9 * 0.9 : 0.9;
			// Corn's N rate is worked out from the (lower) yield curve, so compare at the same N response.
			const sameResponse = fy.nitrogen.responseFactor / plain[i].nitrogen.responseFactor;
			expect(fy.yieldPerAcre).toBeCloseTo(plain[i].yieldPerAcre * factor * sameResponse, 6);
		});
		expect(adjusted.filter((fy) => fy.fieldId === 'west')).toEqual(
			plain.filter((fy) => fy.fieldId === 'west')
		);
	});

	it('an adjustment naming a field or practice the plan does not have is refused by its path', () => {
		const input = smallPlanInput();
		input.plan.adjustments = [
			{ fieldId: 'nowhere', nitrogenChangeLbPerAcre: -20 },
			{ practiceId: 'no-such-practice' },
			{ nitrogenChangeLbPerAcre: -400 }
		];
		const parsed = parsePlanDocument(input);
		expect(parsed.ok).toBe(false);
		if (parsed.ok) return;
		expect(parsed.issues.map((i) => i.path)).toEqual(
			expect.arrayContaining([
				'plan.adjustments.0.fieldId',
				'plan.adjustments.1.practiceId',
				'plan.adjustments.2.nitrogenChangeLbPerAcre'
			])
		);
		expect(
			parsed.issues.find((i) => i.path === 'plan.adjustments.2.nitrogenChangeLbPerAcre')?.message
		).toBe('The N rate change must be at least -300 lb N per acre.');
	});
});
