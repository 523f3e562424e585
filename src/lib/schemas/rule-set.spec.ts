import { describe, expect, it } from 'vitest';
import { ruleSetForm } from './rule-set.ts';

const base = {
	name: 'Pump structures',
	kind: 'fixed',
	percent: '15',
	source: 'Site standard MS-7',
	edition: ''
};

describe('rule-set form', () => {
	it('saves with any subset of per-kind margins, or none', () => {
		const one = ruleSetForm.safeParse({ ...base, perKind: { vane: '20' } });
		expect(one.success, JSON.stringify(one.error?.issues)).toBe(true);
		expect(one.data?.perKind).toEqual({ vane: 20 });
		expect(ruleSetForm.safeParse({ ...base, perKind: {} }).success).toBe(true);
		expect(ruleSetForm.safeParse({ ...base }).success).toBe(true);
	});

	it('still refuses a bad per-kind margin and an unknown kind', () => {
		const bad = ruleSetForm.safeParse({ ...base, perKind: { vane: '120' } });
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toMatch(/at most 100 %/);
		expect(ruleSetForm.safeParse({ ...base, perKind: { nonsense: '10' } }).success).toBe(false);
	});
});
