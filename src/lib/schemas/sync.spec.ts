import { describe, expect, it } from 'vitest';
import { parsePullQuery } from './sync.ts';

const q = (s: string) => parsePullQuery(new URLSearchParams(s));

describe('the pull query', () => {
	it('takes a cursor and a scope key, and a first pull without either', () => {
		expect(q('since=1234&scope=0123456789abcdef').data).toEqual({
			since: 1234,
			scope: '0123456789abcdef'
		});
		expect(q('').data).toEqual({ since: 0, scope: null });
		expect(q('since=').data).toEqual({ since: 0, scope: null });
	});

	it.each(['since=-1', 'since=1.5', 'since=abc', `since=${'9'.repeat(16)}`, "since=0' or 1=1"])(
		'refuses %s with the cursor message',
		(s) => {
			const r = q(s);
			expect(r.success).toBe(false);
			expect(r.error?.issues[0].path).toEqual(['since']);
		}
	);

	it('refuses a scope that is not a key, and a parameter it does not know', () => {
		expect(q('scope=site-1').error?.issues[0].path).toEqual(['scope']);
		expect(q('since=0&limit=5').success).toBe(false);
	});
});
