// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface Locals {
			user: import('$lib/server/auth/access').SessionUser | null;
		}
	}
}

export {};
