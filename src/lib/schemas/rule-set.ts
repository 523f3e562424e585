/** The rule-set form: a fixed margin (with optional per-kind margins) or the amplification rule. */
import { z } from 'zod';
import { SOURCE_KINDS } from './excitation.ts';
import { decimalOrNull } from './form.ts';
import { RULE_TEMPLATES } from '../rules/templates.ts';

const pct = (what: string) =>
	z.preprocess(
		(v) => (typeof v === 'string' ? (decimalOrNull(v) ?? undefined) : v),
		z
			.number({ error: `${what}: enter a percentage.` })
			.min(0, `${what}: 0 % or more.`)
			.max(100, `${what}: at most 100 %.`)
	);

export const ruleSetForm = z
	.object({
		name: z.string().trim().min(2, 'Name: at least 2 characters.').max(100),
		kind: z.enum(['fixed', 'amplification'], { error: 'Kind: fixed or amplification.' }),
		percent: z.preprocess(
			(v) => (v === '' || v === undefined ? null : v),
			pct('Required margin').nullable()
		),
		// any subset of the kinds (zod 4's z.record with enum keys would demand every one)
		perKind: z
			.partialRecord(z.enum(SOURCE_KINDS as [string, ...string[]]), pct('Margin for a kind'))
			.default({}),
		source: z
			.string()
			.trim()
			.min(3, 'Source: say where the rule comes from (standard, site rule, common practice).')
			.max(300),
		edition: z.string().trim().max(100).default('')
	})
	.strict()
	.refine((r) => r.kind === 'amplification' || r.percent !== null, {
		message: 'Required margin: a fixed rule needs a percentage.',
		path: ['percent']
	});

export type RuleSetForm = z.infer<typeof ruleSetForm>;

/** A rule set's id as the save form posts it: empty for a new one. */
export const ruleSetId = z
	.string()
	.max(64, 'Which rule set?')
	.default('')
	.transform((v) => v || null);

/**
 * The save form as posted (`formToObject`): the id, the rule set's fields, and one `perKind.<kind>`
 * field per kind, an empty one meaning that kind takes the rule's own margin.
 */
export function parseRuleSetSave(raw: Record<string, unknown>) {
	const { id, ...rest } = raw;
	const fields: Record<string, unknown> = { perKind: {} };
	const perKind = fields.perKind as Record<string, unknown>;
	for (const [k, v] of Object.entries(rest)) {
		if (!k.startsWith('perKind.')) fields[k] = v;
		else if (typeof v !== 'string' || v.trim() !== '') perKind[k.slice('perKind.'.length)] = v;
	}
	return { id: ruleSetId.safeParse(id), form: ruleSetForm.safeParse(fields) };
}

/**
 * The rule-sets page's address: `?from=<template>` starts the new rule set's form from a
 * published rule. A key that names no template starts an empty form, as a stale link should.
 */
export const ruleSetsQuery = z.object({
	from: z
		.enum(RULE_TEMPLATES.map((t) => t.key) as [string, ...string[]])
		.nullable()
		.catch(null)
		.default(null)
});
