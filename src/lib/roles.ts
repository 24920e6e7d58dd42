/**
 * Farm roles, one list for the database enum, the permission table (server/auth/access.ts), the labels
 * and the demo seed. Safe for the browser.
 */
export const farmRoles = ['owner', 'editor', 'reviewer'] as const;
export type FarmRole = (typeof farmRoles)[number];

export const farmRoleLabels = {
	owner: 'Owner',
	editor: 'Editor',
	reviewer: 'Reviewer'
} as const satisfies Record<FarmRole, string>;
