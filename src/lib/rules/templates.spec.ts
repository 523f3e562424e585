import { describe, expect, it } from 'vitest';
import { RULE_TEMPLATES, ruleTemplate } from './templates.ts';
import { ruleSetForm } from '../schemas/rule-set.ts';
import { requiredMarginPct } from '../vibration/margins.ts';

describe('published rules a rule set can start from', () => {
	it('each passes the rule-set form as it stands, so picking one never yields a refused form', () => {
		for (const t of RULE_TEMPLATES) {
			const r = ruleSetForm.safeParse({
				name: t.name,
				kind: t.kind,
				percent: t.percent === null ? '' : String(t.percent),
				perKind: t.perKind ?? {},
				source: t.source,
				edition: t.edition
			});
			expect(r.success, t.key).toBe(true);
			expect(t.source.length, t.key).toBeGreaterThan(20);
			expect(t.edition, t.key).not.toBe('');
		}
	});

	it('carries API 610’s two figures for vertical pumps’ driver supports, each naming its edition', () => {
		// ../shared/domain.md §1.3: editions differ between 10 % and 20 % for this clause
		const twenty = ruleTemplate('api610-vs-20')!;
		const ten = ruleTemplate('api610-vs-10')!;
		expect(twenty.percent).toBe(20);
		expect(twenty.edition).toMatch(/11th edition/);
		expect(ten.percent).toBe(10);
		for (const t of [twenty, ten])
			expect(
				requiredMarginPct(
					{ kind: 'fixed', percent: t.percent! },
					{ position: 'above', excitationKind: 'shaft' }
				)
			).toBe(t.percent);
		expect(ruleTemplate('nonsense')).toBeNull();
		expect(ruleTemplate(null)).toBeNull();
	});
});
