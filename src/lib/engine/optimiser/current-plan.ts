import type { PlanDocument } from '../../schemas/plan-file';
import { evaluatePlan } from '../index';
import type { OptimisedYear } from './types';

/** The plan as it stands, in the optimiser's year shape, to set beside an optimised mix. */
export function currentPlanYears(plan: PlanDocument): OptimisedYear[] {
	const result = evaluatePlan(plan);
	return result.farmYears.map((farmYear) => {
		const cropAcres = new Map<string, { cropId: string; cropName: string; acres: number }>();
		for (const fy of result.fieldYears) {
			if (fy.year !== farmYear.year) continue;
			const crop = cropAcres.get(fy.crop) ?? { cropId: fy.crop, cropName: fy.cropName, acres: 0 };
			crop.acres += fy.acres;
			cropAcres.set(fy.crop, crop);
		}
		return {
			year: farmYear.year,
			netReturnUsd: farmYear.netReturnUsd,
			nitrogenPurchasedLb: farmYear.nitrogenPurchasedLb,
			dieselGallons: farmYear.dieselGallons,
			labourHours: farmYear.labourHours,
			// A plan does not schedule hired help: every hour is counted as the family's.
			familyLabourHoursByMonth: farmYear.labourHoursByMonth,
			hiredLabourHoursByMonth: new Array<number>(12).fill(0),
			grazingAuDays: farmYear.grazingAuDays,
			hayBales: farmYear.hayBales,
			cropAcres: [...cropAcres.values()].sort((a, b) => b.acres - a.acres)
		};
	});
}
