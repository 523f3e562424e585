import { describe, expect, it } from 'vitest';
import { BackoffThrottle, FailureThrottle } from './throttle.ts';

describe('sign-in throttle', () => {
	it('locks a key after the limit of failures and frees it when the oldest leaves the window', () => {
		const t = new FailureThrottle({ limit: 3, windowMs: 1000 });
		t.fail('a', 0);
		t.fail('a', 100);
		expect(t.retryAfterMs('a', 150)).toBe(0);
		t.fail('a', 200);
		expect(t.retryAfterMs('a', 250)).toBe(750);
		expect(t.retryAfterMs('b', 250)).toBe(0);
		expect(t.retryAfterMs('a', 1000)).toBe(0);
	});

	it('forgets a key on reset (a successful sign-in)', () => {
		const t = new FailureThrottle({ limit: 1, windowMs: 1000 });
		t.fail('a', 0);
		expect(t.retryAfterMs('a', 1)).toBeGreaterThan(0);
		t.reset('a');
		expect(t.retryAfterMs('a', 1)).toBe(0);
	});

	it('per account, waits grow with each failure and never exceed the cap: no lock-out for the holder', () => {
		const t = new BackoffThrottle({
			free: 4,
			firstWaitMs: 30_000,
			maxWaitMs: 15 * 60_000,
			forgetAfterMs: 3_600_000
		});
		const waits: number[] = [];
		let now = 0;
		for (let i = 0; i < 12; i++) {
			now += t.retryAfterMs('holder', now); // tries again as soon as allowed
			t.fail('holder', now);
			waits.push(t.retryAfterMs('holder', now) / 1000);
		}
		expect(waits).toEqual([0, 0, 0, 30, 60, 120, 240, 480, 900, 900, 900, 900]);
		t.reset('holder'); // an admin's unlock, or a successful sign-in
		expect(t.retryAfterMs('holder', now)).toBe(0);
		t.fail('quiet', 0);
		expect(t.failures('quiet', 3_600_001)).toBe(0);
	});
});
