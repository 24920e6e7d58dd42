/** Labels for farm roles, safe for the browser (the permission table itself lives in server/auth/access.ts). */
export const farmRoleLabels = { owner: 'Owner', editor: 'Editor', reviewer: 'Reviewer' } as const;
