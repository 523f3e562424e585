import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { freshDatabase } from '../test-db.ts';
import * as users from '../db/users.ts';
import {
	createSession,
	endSession,
	SIGN_IN_FAILED,
	signIn,
	signInPause,
	unlockSignIn,
	validateSession
} from './index.ts';
import { hashPassword } from './password.ts';
import { hashSessionId } from './hashed-adapter.ts';
import { db } from '../db/index.ts';
import { sessions } from '../db/schema.ts';

const HOUR = 3_600_000;
let userId: string;

beforeAll(async () => {
	await freshDatabase();
	userId = users.create(
		{
			email: 'shift@example.com',
			name: 'Shift Worker',
			role: 'technician',
			passwordHash: await hashPassword('night-shift-pass'),
			siteIds: []
		},
		null
	);
	users.create(
		{
			email: 'tablet@example.com',
			name: 'Shared Tablet',
			role: 'technician',
			passwordHash: await hashPassword('tablet-pass-2026'),
			siteIds: []
		},
		null
	);
});

afterEach(() => {
	vi.useRealTimers();
});

const idOf = (cookieValue: string) => cookieValue;

describe('sessions', () => {
	it('are stored as SHA-256 hashes: an id read from the database opens nothing', async () => {
		const cookie = await createSession(userId);
		const stored = db
			.select()
			.from(sessions)
			.all()
			.map((r) => r.id);
		expect(stored).not.toContain(cookie.value);
		expect(stored).toContain(hashSessionId(cookie.value));
		expect((await validateSession(cookie.value)).user?.email).toBe('shift@example.com');
		for (const leaked of stored) expect((await validateSession(leaked)).user).toBeNull();
		await endSession(cookie.value);
		expect(
			db
				.select()
				.from(sessions)
				.all()
				.map((r) => r.id)
		).not.toContain(hashSessionId(cookie.value));
	});

	it('last a whole 12-hour shift and slide while the tablet is in use', async () => {
		vi.useFakeTimers({ toFake: ['Date'] });
		vi.setSystemTime(0);
		const cookie = await createSession(userId);
		expect(cookie.attributes.httpOnly).toBe(true);
		expect(cookie.attributes.sameSite).toBe('lax');
		const id = idOf(cookie.value);
		vi.setSystemTime(12 * HOUR);
		const atEndOfShift = await validateSession(id);
		expect(atEndOfShift.user?.email).toBe('shift@example.com');
		// past half its life, so lucia renewed it and we hand back a fresh cookie
		expect(atEndOfShift.session?.fresh).toBe(true);
		expect(atEndOfShift.cookie?.value).toBe(id);
		vi.setSystemTime(25 * HOUR);
		expect((await validateSession(id)).user?.email).toBe('shift@example.com');
	});

	it('expire when unused for longer than their lifetime', async () => {
		vi.useFakeTimers({ toFake: ['Date'] });
		vi.setSystemTime(0);
		const { value } = await createSession(userId);
		vi.setSystemTime(14 * HOUR + 1);
		const r = await validateSession(value);
		expect(r.user).toBeNull();
		expect(r.cookie?.value).toBe(''); // a blank cookie clears it in the browser
	});

	it('end on sign-out', async () => {
		const { value } = await createSession(userId);
		await endSession(value);
		expect((await validateSession(value)).user).toBeNull();
	});

	it('are refused for a disabled account', async () => {
		const { value } = await createSession(userId);
		users.setDisabled(userId, true, userId);
		expect((await validateSession(value)).user).toBeNull();
		users.setDisabled(userId, false, userId);
	});
});

describe('signing in', () => {
	it('gives one message for an unknown address and a wrong password', async () => {
		const unknown = await signIn('nobody@example.com', 'whatever-pass', '10.0.0.1');
		const wrong = await signIn('shift@example.com', 'wrong-password', '10.0.0.2');
		expect(unknown).toEqual({ ok: false, message: SIGN_IN_FAILED });
		expect(wrong).toEqual({ ok: false, message: SIGN_IN_FAILED });
		expect(await signIn('Shift@Example.com ', 'night-shift-pass', '10.0.0.3')).toMatchObject({
			ok: true,
			role: 'technician'
		});
	});

	it('makes an account wait after five failures, whoever tries, and says how long; an unlock lifts it', async () => {
		for (let i = 0; i < 5; i++) await signIn('shift@example.com', 'bad', `10.1.0.${i}`);
		const r = await signIn('shift@example.com', 'night-shift-pass', '10.1.0.99');
		expect(r.ok).toBe(false);
		expect(r.ok === false && r.message).toMatch(/Too many sign-in attempts. Wait 1 minute/);
		expect(signInPause('shift@example.com')).toMatchObject({ failures: 5 });
		unlockSignIn('shift@example.com');
		expect((await signIn('shift@example.com', 'night-shift-pass', '10.1.0.99')).ok).toBe(true);
	});

	it('holds its budget when many attempts arrive at once (none slips through while a password is being checked)', async () => {
		const results = await Promise.all(
			Array.from({ length: 40 }, (_, i) => signIn('shift@example.com', `guess-${i}`, `10.2.0.${i}`))
		);
		const judged = results.filter((r) => r.ok === false && r.message === SIGN_IN_FAILED);
		expect(judged).toHaveLength(5);
		expect(results.filter((r) => r.ok === false && r.retryAfterS !== undefined)).toHaveLength(35);
		// the right password is refused too until the window has passed
		expect((await signIn('shift@example.com', 'night-shift-pass', '10.2.1.1')).ok).toBe(false);
	});

	it('gives back the slot a successful sign-in reserved: a shared tablet signs in all shift long', async () => {
		// 40 sign-ins, up to 5 at once, from one address whose budget is 30
		for (let round = 0; round < 8; round++) {
			const ok = await Promise.all(
				Array.from({ length: 5 }, () =>
					signIn('tablet@example.com', 'tablet-pass-2026', '10.3.0.1')
				)
			);
			expect(ok.every((r) => r.ok)).toBe(true);
		}
	});
});
