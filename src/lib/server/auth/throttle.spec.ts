import { describe, expect, it } from 'vitest';
import { FailureThrottle } from './throttle.ts';

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
});
