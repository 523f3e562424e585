import { describe, expect, it } from 'vitest';
import { parseRuleSetSave, ruleSetForm, ruleSetsQuery } from './rule-set.ts';

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

describe('the rule-set save form as posted', () => {
	it('gathers the perKind.<kind> fields, leaves empty ones out, and reads an empty id as new', () => {
		const r = parseRuleSetSave({
			...base,
			id: '',
			'perKind.vane': '20',
			'perKind.blade': ' ',
			'perKind.gear': ''
		});
		expect(r.id.data).toBeNull();
		expect(r.form.data?.perKind).toEqual({ vane: 20 });
		expect(parseRuleSetSave({ ...base, id: 'rs-1' }).id.data).toBe('rs-1');
	});

	it('refuses a margin for a kind that does not exist and an overlong id', () => {
		expect(parseRuleSetSave({ ...base, 'perKind.nonsense': '10' }).form.success).toBe(false);
		expect(parseRuleSetSave({ ...base, id: 'x'.repeat(65) }).id.success).toBe(false);
	});
});

describe('the rule-sets page address', () => {
	it('names a published template, or none for a key that is not one', () => {
		expect(ruleSetsQuery.parse({ from: 'api684-af' }).from).toBe('api684-af');
		expect(ruleSetsQuery.parse({ from: 'no-such-rule' }).from).toBeNull();
		expect(ruleSetsQuery.parse({}).from).toBeNull();
	});
});
