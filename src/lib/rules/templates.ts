/**
 * Published separation rules a new rule set can start from, each naming its source and edition.
 * The figures are as ../shared/domain.md §1.2–1.3 records them from public secondary sources;
 * every one asks to be confirmed against the licensed standard before it governs a plant. They
 * fill the new-rule-set form; nothing is saved until a person saves it.
 */
import type { ExcitationKind } from '../vibration/excitation.ts';

export interface RuleTemplate {
	key: string;
	/** the button's words */
	label: string;
	name: string;
	kind: 'fixed' | 'amplification';
	percent: number | null;
	perKind: Partial<Record<ExcitationKind, number>> | null;
	source: string;
	edition: string;
}

export const RULE_TEMPLATES: readonly RuleTemplate[] = [
	{
		key: 'api610-bearing-housing',
		label: 'API 610 bearing housings, 10 %',
		name: 'API 610 bearing housings ±10 %',
		kind: 'fixed',
		percent: 10,
		perKind: null,
		source:
			'API 610 (ISO 13709) bearing-housing resonance test: natural frequencies at least 10 % from the operating speed range (1×, and 2× in some editions); confirm the clause and orders in your edition',
		edition: 'edition to confirm against your copy'
	},
	{
		key: 'api610-vs-20',
		label: 'API 610 vertical pump driver support, 20 %',
		name: 'API 610 VS pump driver support structure 20 %',
		kind: 'fixed',
		percent: 20,
		perKind: null,
		source:
			'API 610 9.5.3 as quoted from the 11th edition: the natural frequency of the motor support structure of vertically suspended pumps at least 20 % from running speed',
		edition: '11th edition (as quoted in secondary sources; confirm)'
	},
	{
		key: 'api610-vs-10',
		label: 'API 610 vertical pump driver support, 10 %',
		name: 'API 610 VS pump/driver support structure 10 %',
		kind: 'fixed',
		percent: 10,
		perKind: null,
		source:
			'API 610 structural separation: pump and driver support structure of vertically suspended pumps at least 10 % from the operating speed range (editions differ between 10 % and 20 %)',
		edition: 'edition to confirm against your copy'
	},
	{
		key: 'api684-af',
		label: 'API RP 684 rotor criticals, by amplification factor',
		name: 'Rotor criticals: amplification-factor based',
		kind: 'amplification',
		percent: 10,
		perKind: null,
		source:
			'API RP 684 / API 617 amplification-factor rule for rotor lateral critical speeds (no margin below AF 2.5; up to 16 % below, 26 % above the range); other excitations at the fixed margin',
		edition: 'as read from public secondary sources; confirm'
	},
	{
		key: 'practice-20',
		label: 'Lightly damped structures, 20 % (common practice)',
		name: 'Lightly damped structures ±20 %',
		kind: 'fixed',
		percent: 20,
		perKind: null,
		source: 'Common practice: ±20–25 % for lightly damped structures or where speed is uncertain',
		edition: 'common practice (not a standard)'
	}
];

export function ruleTemplate(key: string | null): RuleTemplate | null {
	return RULE_TEMPLATES.find((t) => t.key === key) ?? null;
}
