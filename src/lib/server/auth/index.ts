/**
 * Sign-in and sessions. Everything else talks to this module only, so replacing lucia (v3 is its
 * last version) is a change here and nowhere else.
 */
import { Lucia, TimeSpan } from 'lucia';
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { setting } from '../config.ts';
import { db } from '../db/index.ts';
import { sessions, users } from '../db/schema.ts';
import * as userQueries from '../db/users.ts';
import type { Role } from '../../roles.ts';
import type { FrequencyUnit } from '../../frequency.ts';
import { burnVerification, verifyPassword } from './password.ts';
import { accountThrottle, addressThrottle } from './throttle.ts';
import { HashedSessionAdapter } from './hashed-adapter.ts';

export { hashPassword, verifyPassword } from './password.ts';

/**
 * 14 hours, renewed on use once half has passed: a session opened at the start of a 12-hour shift
 * lasts the whole shift and keeps sliding while the tablet is used.
 */
export const SESSION_LIFETIME = new TimeSpan(14, 'h');

/** Secure cookies when served over https (ORIGIN), or when COOKIE_SECURE=true forces them. */
function secureCookies(): boolean {
	const forced = setting('COOKIE_SECURE');
	if (forced === 'true') return true;
	if (forced === 'false') return false;
	return (setting('ORIGIN') ?? '').startsWith('https://');
}

export const lucia = new Lucia(
	new HashedSessionAdapter(new DrizzleSQLiteAdapter(db, sessions, users)),
	{
		sessionExpiresIn: SESSION_LIFETIME,
		sessionCookie: {
			name: 'detune_session',
			attributes: { secure: secureCookies(), sameSite: 'lax' }
		},
		getUserAttributes: (a) => ({
			email: a.email,
			name: a.name,
			role: a.role,
			disabled: a.disabled,
			unitSystem: a.unitSystem,
			frequencyUnit: a.frequencyUnit
		})
	}
);

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseUserAttributes: {
			email: string;
			name: string;
			role: Role;
			disabled: boolean;
			unitSystem: 'metric' | 'us';
			frequencyUnit: FrequencyUnit;
		};
	}
}

export type SessionUser = import('lucia').User;
export type Session = import('lucia').Session;
export const SESSION_COOKIE = lucia.sessionCookieName;

export interface CookieToSet {
	name: string;
	value: string;
	attributes: import('lucia').CookieAttributes;
}

export async function createSession(userId: string): Promise<CookieToSet> {
	const session = await lucia.createSession(userId, {});
	const c = lucia.createSessionCookie(session.id);
	return { name: c.name, value: c.value, attributes: c.attributes };
}

/** Validates a session id; returns a refreshed cookie when lucia extended the session. */
export async function validateSession(
	sessionId: string
): Promise<{ user: SessionUser | null; session: Session | null; cookie: CookieToSet | null }> {
	const { session, user } = await lucia.validateSession(sessionId);
	if (!session || !user) {
		const blank = lucia.createBlankSessionCookie();
		return {
			user: null,
			session: null,
			cookie: { name: blank.name, value: blank.value, attributes: blank.attributes }
		};
	}
	if (user.disabled) {
		await lucia.invalidateSession(session.id);
		const blank = lucia.createBlankSessionCookie();
		return {
			user: null,
			session: null,
			cookie: { name: blank.name, value: blank.value, attributes: blank.attributes }
		};
	}
	if (session.fresh) {
		const c = lucia.createSessionCookie(session.id);
		return { user, session, cookie: { name: c.name, value: c.value, attributes: c.attributes } };
	}
	return { user, session, cookie: null };
}

export async function endSession(sessionId: string): Promise<CookieToSet> {
	await lucia.invalidateSession(sessionId);
	const blank = lucia.createBlankSessionCookie();
	return { name: blank.name, value: blank.value, attributes: blank.attributes };
}

export async function endAllSessions(userId: string): Promise<void> {
	await lucia.invalidateUserSessions(userId);
}

/** How long an account must wait before its next sign-in, and after how many failures. */
export function signInPause(email: string): { failures: number; waitS: number } {
	const key = email.trim().toLowerCase();
	return {
		failures: accountThrottle.failures(key),
		waitS: Math.ceil(accountThrottle.retryAfterMs(key) / 1000)
	};
}

/** An admin lifts an account's sign-in wait at once (the person called the help desk). */
export function unlockSignIn(email: string): void {
	accountThrottle.reset(email.trim().toLowerCase());
}

/** The one message for a wrong e-mail or password: it never says which. */
export const SIGN_IN_FAILED = 'That e-mail and password do not match an active account.';

export type SignInResult =
	{ ok: true; userId: string; role: Role } | { ok: false; message: string; retryAfterS?: number };

/**
 * Checks a sign-in attempt against both throttles, then the password. Unknown address, wrong
 * password and disabled account all get the same message and take the same time.
 */
export async function signIn(
	email: string,
	password: string,
	clientAddress: string
): Promise<SignInResult> {
	const accountKey = email.trim().toLowerCase();
	const wait = Math.max(
		accountThrottle.retryAfterMs(accountKey),
		addressThrottle.retryAfterMs(clientAddress)
	);
	if (wait > 0) {
		const minutes = Math.ceil(wait / 60_000);
		return {
			ok: false,
			message: `Too many sign-in attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`,
			retryAfterS: Math.ceil(wait / 1000)
		};
	}
	// Each attempt counts as a failure before the (slow, asynchronous) password check, so that
	// attempts arriving together cannot all pass the budget check above; a success takes it back.
	const at = Date.now();
	accountThrottle.fail(accountKey, at);
	addressThrottle.fail(clientAddress, at);
	const user = userQueries.byEmail(accountKey);
	const valid = user
		? await verifyPassword(user.passwordHash, password)
		: (await burnVerification(password), false);
	if (!user || !valid || user.disabled) return { ok: false, message: SIGN_IN_FAILED };
	accountThrottle.reset(accountKey);
	addressThrottle.release(clientAddress, at);
	return { ok: true, userId: user.id, role: user.role };
}
