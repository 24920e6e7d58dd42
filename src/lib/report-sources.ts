/**
 * The standing assumptions of every Furrowcast budget, each with the published source the engine's
 * formula follows (the same sources its code comments and tests name). Printed in the plan report beside
 * the plan's own assumptions so a reviewer can see where each figure comes from.
 */
export const methodAssumptions = [
	{
		topic: 'Field capacity',
		assumption:
			'Effective field capacity (ac/h) = speed (mph) × width (ft) × field efficiency ÷ 8.25; machine and labour hours follow from it.',
		source: 'ASABE EP496/D497, as used in Iowa State University Ag Decision Maker A3-24'
	},
	{
		topic: 'Diesel',
		assumption:
			'Where an operation states tractor power rather than fuel per acre, diesel is 0.044 gal per maximum PTO hp-hour, a year-round average.',
		source: 'Iowa State University A3-29 "Estimating Farm Machinery Costs" (from ASAE D497)'
	},
	{
		topic: 'Animal units',
		assumption:
			'One animal unit is 1,000 lb of live weight, eating about 26 lb of forage dry matter a day; an AUM is one animal unit for 30 days.',
		source: 'Society for Range Management, Glossary of Terms Used in Range Management'
	},
	{
		topic: 'Hay bought',
		assumption:
			'Hay put out is what cattle eat ÷ (1 − feeding waste); grazing meets the herd’s needs first and hay the rest.',
		source: 'Oklahoma State University Extension (Lalman), hay feeding waste'
	},
	{
		topic: 'Corn residue grazing',
		assumption: 'Residue cattle eat = grain bushels × leaf and husk per bushel × utilisation.',
		source: 'University of Nebraska–Lincoln Extension (Rasby, 2007)'
	},
	{
		topic: 'Cover crop N credit',
		assumption: 'First-season N from a legume cover = biomass × legume share × % N × availability.',
		source: 'SARE, Managing Cover Crops Profitably'
	},
	{
		topic: 'N rates',
		assumption:
			'N rates are the plan’s own; corn after corn needs more N than corn after soybean (a warning names it).',
		source: 'Iowa State University, Maximum Return to N (MRTN) guidelines'
	},
	{
		topic: 'Partial budget',
		assumption:
			'Net change = (added returns + reduced costs) − (added costs + reduced returns); only what changes is listed.',
		source: 'NDSU (Saxowsky), "Introduction to Partial Budgeting"; Purdue University (Langemeier)'
	}
] as const;

/** The cautions every report and review screen carries. */
export const reportCautions = [
	'All figures are estimates from the numbers the farm entered; actual yields, prices and costs will differ.',
	'Nitrogen rates must follow local regulations, a current soil test and licensed agronomic advice.',
	'Credit decisions rest with the lender; this report supports that decision and does not make it.'
] as const;
