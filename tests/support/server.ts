/** Where the built app runs during integration and end-to-end tests (started by test-servers.ts). */
export const baseUrl = `http://127.0.0.1:${process.env.TEST_PORT}`;

export const DEMO_PASSWORD = 'furrowcast-demo';
export const demoUsers = {
	owner: 'owner@furrowcast.test',
	partner: 'partner@furrowcast.test',
	lender: 'lender@furrowcast.test',
	admin: 'admin@furrowcast.test',
	birchHollowOwner: 'birchhollow@furrowcast.test'
} as const;
