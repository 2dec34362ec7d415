// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Error {
			message: string;
			code?: string;
			errorId?: string;
		}
		interface Locals {
			user: import('$lib/server/auth').SessionUser | null;
			session: import('lucia').Session | null;
		}
	}
}
export {};
