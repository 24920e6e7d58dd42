/**
 * Nitrogen: a quadratic-plateau yield response to available N (applied + credits), the economic
 * optimum N rate, and the credits a field carries into the next year.
 */

export interface QuadraticPlateau {
	interceptBuPerAcre: number;
	linearBuPerLbN: number;
	quadraticBuPerLbN2: number;
}

/** Where the quadratic meets its plateau: the agronomic maximum N = b / (2c) (Cerrato & Blackmer 1990). */
export function plateauJoinLbN(response: QuadraticPlateau): number {
	return response.linearBuPerLbN / (2 * response.quadraticBuPerLbN2);
}

/** Y = a + bN − cN² below the join point, flat above it. */
export function responseYieldBuPerAcre(
	response: QuadraticPlateau,
	availableNLbPerAcre: number
): number {
	const n = Math.min(Math.max(availableNLbPerAcre, 0), plateauJoinLbN(response));
	return (
		response.interceptBuPerAcre + response.linearBuPerLbN * n - response.quadraticBuPerLbN2 * n * n
	);
}

export function plateauYieldBuPerAcre(response: QuadraticPlateau): number {
	return responseYieldBuPerAcre(response, plateauJoinLbN(response));
}

/** Price ratio: $ per lb N ÷ $ per bu grain (ISU Integrated Crop Management News, 2014). */
export function nitrogenPriceRatio(nitrogenUsdPerLb: number, grainUsdPerBu: number): number {
	return grainUsdPerBu > 0 ? nitrogenUsdPerLb / grainUsdPerBu : Infinity;
}

/**
 * Economic optimum N rate: where the last pound of N pays for itself, dY/dN = price ratio. On the curve
 * itself that is EONR = (b − R) / (2c) (Fausti et al. 2017). The field's yield is the curve scaled by
 * `yieldScale` (the yield goal × productivity × adjustment per bushel of the curve's plateau), so its
 * slope is yieldScale × (b − 2cN) and EONR = (b − R / yieldScale) / (2c); never above the plateau join
 * (the agronomic maximum) nor below zero.
 */
export function economicOptimumNLbPerAcre(
	response: QuadraticPlateau,
	priceRatio: number,
	yieldScale = 1
): number {
	if (!(yieldScale > 0)) return 0;
	const optimum =
		(response.linearBuPerLbN - priceRatio / yieldScale) / (2 * response.quadraticBuPerLbN2);
	return Math.min(Math.max(optimum, 0), plateauJoinLbN(response));
}

/**
 * First-season N from a legume cover: biomass × legume share × %N × availability (SARE Managing Cover
 * Crops Profitably). What cattle eat is not left to decay in the field, so the grazed share is taken off.
 */
export function legumeCoverCreditLbPerAcre(
	biomassLbDmPerAcre: number,
	legumeSharePercent: number,
	legumeNitrogenPercent: number,
	nitrogenAvailablePercent: number,
	grazedPercent: number
): number {
	return (
		biomassLbDmPerAcre *
		(legumeSharePercent / 100) *
		(1 - grazedPercent / 100) *
		(legumeNitrogenPercent / 100) *
		(nitrogenAvailablePercent / 100)
	);
}

/** N returned by grazing cattle and available to the next crop: AU-days × lb N per AU-day × availability. */
export function grazingManureCreditLbPerAcre(
	auDaysPerAcre: number,
	manureNitrogenLbPerAuDay: number,
	manureNitrogenAvailablePercent: number
): number {
	return auDaysPerAcre * manureNitrogenLbPerAuDay * (manureNitrogenAvailablePercent / 100);
}
