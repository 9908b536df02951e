// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Role } from '$lib/server/db/models/Membership';

declare global {
	namespace App {
		interface Error {
			message: string;
			/** Quoted to the user so support can find the log line; no internals are shown. */
			errorId?: string;
			/** For /api answers: a stable machine-readable code and the offending field. */
			code?: string;
			field?: string;
		}
		interface Locals {
			user: { id: number; email: string; displayName: string } | null;
			session: { id: string; expiresAt: Date; fresh: boolean } | null;
			/** The active organisation and the user's role in it. */
			membership: { organisationId: number; organisationName: string; role: Role } | null;
			/** How the request proved who it is. */
			authMethod: 'session' | 'token' | null;
			requestId: string;
			/** Set when a load or action found the database unreachable: the answer becomes a 503. */
			databaseUnavailable?: boolean;
		}
		// interface PageData {}
		// interface PageState {}
		// interface Platform {}
	}
}

export {};
