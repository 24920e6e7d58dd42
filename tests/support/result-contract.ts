/** JSON names of the evaluation result that advisors script against (issue 3's public contract). */
export const farmYearNames = [
	'year',
	'netReturnUsd',
	'netReturnUsdPerAcre',
	'netReturnUsdPerFamilyLabourHour',
	'revenueUsd',
	'costsUsd',
	'nitrogenPurchasedLb',
	'dieselGallons',
	'labourHours',
	'labourHoursByMonth',
	'choreHours',
	'herdDemandAuDays',
	'grazingAuDays',
	'hayBales',
	'hayCostUsd'
];

export const partialBudgetNames = [
	'addedReturnsUsd',
	'reducedCostsUsd',
	'addedCostsUsd',
	'reducedReturnsUsd',
	'netChangeUsd'
];
