/**
 * The first run of a real installation: no demo data and no published password. When the
 * database has no admin, the server prints a one-time link with a random token; the page behind
 * it creates the first admin and then refuses for good (an admin exists).
 */
import { encodeBase32LowerCaseNoPadding } from '@oslojs/encoding';
import { timingSafeEqual } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { db } from './db/index.ts';
import { users } from './db/schema.ts';

let token: string | null = null;

export function adminExists(): boolean {
	return (
		(db
			.select({ n: sql<number>`count(*)` })
			.from(users)
			.where(and(eq(users.role, 'admin'), eq(users.disabled, false)))
			.get()?.n ?? 0) > 0
	);
}

/** A new token for this start, when there is no admin yet; null otherwise. */
export function openSetup(): string | null {
	token = adminExists()
		? null
		: encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(20)));
	return token;
}

/** Whether `candidate` is this start's setup token and the setup is still open. */
export function setupAllowed(candidate: string | null): boolean {
	if (!token || !candidate || adminExists()) return false;
	const a = Buffer.from(candidate);
	const b = Buffer.from(token);
	return a.length === b.length && timingSafeEqual(a, b);
}

export function closeSetup(): void {
	token = null;
}
