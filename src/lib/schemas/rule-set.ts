/** The rule-set form: a fixed margin (with optional per-kind margins) or the amplification rule. */
import { z } from 'zod';
import { SOURCE_KINDS } from './excitation.ts';

const pct = (what: string) =>
	z.preprocess(
		(v) =>
			typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v.replace(',', '.'))) : v,
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
