/**
 * How a field is held and who works on the farm: one list each for the database enums, the schemas and
 * the labels the pages print. Safe for the browser.
 */
export const tenures = ['owned', 'cash-rented'] as const;
export type Tenure = (typeof tenures)[number];

export const tenureLabels = {
	owned: 'Owned',
	'cash-rented': 'Cash-rented'
} as const satisfies Record<Tenure, string>;

/** Operator, partner and family hours are the farm's own labour; hired hours are bought at a wage. */
export const personRoles = ['operator', 'partner', 'family', 'hired'] as const;
export type PersonRole = (typeof personRoles)[number];

export const personRoleLabels = {
	operator: 'Operator',
	partner: 'Partner',
	family: 'Family',
	hired: 'Hired help'
} as const satisfies Record<PersonRole, string>;

/** True for the people whose hours are the family's own (not bought). */
export function isFamilyLabour(role: PersonRole): boolean {
	return role !== 'hired';
}
