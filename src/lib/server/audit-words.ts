/**
 * The audit log as people read it: the asset's tag and name (for changes to its sources, checks
 * and follow-ups too), the user's name, field labels as on the forms, values in words (names for
 * ids, sources described, yes/no), before → after. Used by the audit page and its CSV export.
 */
import { inArray } from 'drizzle-orm';
import { db } from './db/index.ts';
import { assets, checks, followUps, ruleSets, sites, users } from './db/schema.ts';
import { describeSource, SOURCE_KIND_LABELS, type SourceKind } from '../schemas/excitation.ts';
import type { FrequencyUnit } from '../frequency.ts';
import { dayTimeUtc } from '../format.ts';

/** Field keys as the forms label them. */
export const FIELD_LABELS: Record<string, string> = {
	tag: 'Tag',
	name: 'Name',
	email: 'E-mail',
	role: 'Role',
	siteIds: 'Sites',
	disabled: 'Disabled',
	machineKind: 'Machine kind',
	driveType: 'Drive',
	minRpm: 'Minimum speed (rpm)',
	maxRpm: 'Maximum speed (rpm)',
	nominalRpm: 'Nominal speed (rpm)',
	motorPoles: 'Motor poles',
	slipPct: 'Motor slip (%)',
	driveRatio: 'Drive ratio',
	skipBands: 'Skip bands',
	ruleSetId: 'Rule set',
	areaId: 'Area',
	siteId: 'Site',
	notes: 'Notes',
	label: 'Label',
	params: 'Values',
	kind: 'Kind',
	percent: 'Required margin (%)',
	perKind: 'Margins per excitation kind',
	source: 'Source',
	edition: 'Edition',
	recheckDays: 'Recheck every (days)',
	area: 'Area',
	title: 'What is to be done',
	assigneeId: 'Assigned to',
	dueDate: 'Due date',
	priority: 'Priority',
	status: 'Status',
	checkId: 'Check',
	outcome: 'Review',
	comment: 'Comment',
	by: 'Reviewed by',
	missing: 'Not measured by the retest',
	code: 'Code',
	lineFrequencyHz: 'Line frequency (Hz)',
	machineGroup: 'Machine group (severity)',
	abMmS: 'Zone A/B boundary (mm/s)',
	bcMmS: 'Zone B/C boundary (mm/s)',
	cdMmS: 'Zone C/D boundary (mm/s)'
};

/** Keys that carry context, not a change of their own. */
const CONTEXT = new Set(['asset']);

export interface AuditRow {
	id: number;
	at: number;
	entity: string;
	entityId: string;
	action: string;
	before: Record<string, unknown> | null;
	after: Record<string, unknown> | null;
	userName: string | null;
}

export interface AuditLine {
	id: number;
	at: number;
	when: string;
	who: string;
	/** what was changed, in words: "KRW-RWP-101 · Raw water pump 1", "rule set Plant default" */
	subject: string;
	assetId: string | null;
	action: string;
	changes: { field: string; before: string; after: string }[];
}

const ACTION_WORDS: Record<string, string> = {
	create: 'created',
	update: 'changed',
	review: 'reviewed',
	'review-withdrawn': 'review withdrawn',
	'reset-password': 'password reset'
};

/** id → what a query reads for those ids, in one query (none when there are no ids). */
function lookup<T>(ids: Iterable<string>, read: (ids: string[]) => [string, T][]): Map<string, T> {
	const list = [...new Set(ids)];
	return new Map(list.length ? read(list) : []);
}

/** The values of `keys` in the rows' before and after, flattened (arrays too). */
function idsUnder(rows: AuditRow[], keys: string[]): string[] {
	return rows.flatMap((r) =>
		[r.before, r.after].flatMap((side) =>
			keys.flatMap((k) => {
				const v = side?.[k];
				return Array.isArray(v) ? v.map(String) : v ? [String(v)] : [];
			})
		)
	);
}

const idsOf = (rows: AuditRow[], entity: string) =>
	rows.filter((r) => r.entity === entity).map((r) => r.entityId);

/** The asset each row is about (directly, or through its source, check or follow-up). */
function assetsOf(rows: AuditRow[]): Map<number, string> {
	const checkAsset = lookup(idsOf(rows, 'check'), (ids) =>
		db
			.select({ id: checks.id, assetId: checks.assetId })
			.from(checks)
			.where(inArray(checks.id, ids))
			.all()
			.map((c) => [c.id, c.assetId])
	);
	const fuAsset = lookup(idsOf(rows, 'follow_up'), (ids) =>
		db
			.select({ id: followUps.id, assetId: followUps.assetId })
			.from(followUps)
			.where(inArray(followUps.id, ids))
			.all()
			.map((f) => [f.id, f.assetId])
	);
	const byRow = new Map<number, string>();
	for (const r of rows) {
		const id =
			r.entity === 'asset'
				? r.entityId
				: r.entity === 'excitation_source'
					? ((r.before?.asset ?? r.after?.asset) as string | undefined)
					: r.entity === 'check'
						? checkAsset.get(r.entityId)
						: r.entity === 'follow_up'
							? fuAsset.get(r.entityId)
							: undefined;
		if (id) byRow.set(r.id, id);
	}
	return byRow;
}

/** The rows in words; a fixed forcing frequency in the reader's unit (Hz unless told). */
export function inWords(rows: AuditRow[], frequencyUnit: FrequencyUnit = 'Hz'): AuditLine[] {
	const assetOf = assetsOf(rows);
	// only the names these rows mention: the asset sheet calls this on every view
	const names = {
		asset: lookup(assetOf.values(), (ids) =>
			db
				.select({ id: assets.id, tag: assets.tag, name: assets.name })
				.from(assets)
				.where(inArray(assets.id, ids))
				.all()
				.map((a) => [a.id, `${a.tag} · ${a.name}`])
		),
		user: lookup([...idsOf(rows, 'user'), ...idsUnder(rows, ['assigneeId', 'by'])], (ids) =>
			db
				.select({ id: users.id, name: users.name })
				.from(users)
				.where(inArray(users.id, ids))
				.all()
				.map((u) => [u.id, u.name])
		),
		rule: lookup([...idsOf(rows, 'rule_set'), ...idsUnder(rows, ['ruleSetId'])], (ids) =>
			db
				.select({ id: ruleSets.id, name: ruleSets.name })
				.from(ruleSets)
				.where(inArray(ruleSets.id, ids))
				.all()
				.map((r) => [r.id, r.name])
		),
		site: lookup([...idsOf(rows, 'site'), ...idsUnder(rows, ['siteId', 'siteIds'])], (ids) =>
			db
				.select({ id: sites.id, name: sites.name })
				.from(sites)
				.where(inArray(sites.id, ids))
				.all()
				.map((x) => [x.id, x.name])
		)
	};
	const value = (key: string, v: unknown, row: AuditRow, side: 'before' | 'after'): string => {
		if (v === null || v === undefined || v === '') return '—';
		if (typeof v === 'boolean') return v ? 'yes' : 'no';
		if (key === 'ruleSetId') return names.rule.get(String(v)) ?? '(a rule set since removed)';
		if (key === 'assigneeId' || key === 'by')
			return names.user.get(String(v)) ?? '(a removed user)';
		if (key === 'siteId') return names.site.get(String(v)) ?? '(a removed site)';
		if (key === 'siteIds' && Array.isArray(v))
			return v.map((s) => names.site.get(String(s)) ?? '?').join(', ') || '—';
		if (key === 'checkId') return 'the check';
		if (key === 'params') {
			const kind = String(
				row[side]?.kind ?? row.action.replace(/^(add|remove|update) | on asset$/g, '')
			);
			return describeSource(kind, '', v, frequencyUnit).replace(/^[^:]*: /, '');
		}
		if (key === 'kind' && row.entity === 'excitation_source')
			return SOURCE_KIND_LABELS[v as SourceKind] ?? String(v);
		if (key === 'perKind' && typeof v === 'object')
			return (
				Object.entries(v as Record<string, number>)
					.map(([k, p]) => `${SOURCE_KIND_LABELS[k as SourceKind] ?? k} ${p} %`)
					.join(', ') || '—'
			);
		if (key === 'missing' && Array.isArray(v))
			return v
				.map((p: { direction?: string; location?: string }) =>
					[p.direction, p.location].filter(Boolean).join(' at ')
				)
				.join('; ');
		if (typeof v === 'object') return JSON.stringify(v).replace(/[{}"]/g, '').replace(/,/g, ', ');
		return String(v);
	};
	return rows.map((r) => {
		const assetId = assetOf.get(r.id) ?? null;
		const subject =
			assetId !== null
				? `${names.asset.get(assetId) ?? 'a removed asset'}${r.entity === 'check' ? ' (a check)' : r.entity === 'follow_up' ? ' (a follow-up)' : r.entity === 'excitation_source' ? ' (an excitation source)' : ''}`
				: r.entity === 'rule_set'
					? `rule set ${names.rule.get(r.entityId) ?? String(r.after?.name ?? r.before?.name ?? '')}`
					: r.entity === 'site'
						? `site ${names.site.get(r.entityId) ?? ''}`
						: r.entity === 'user'
							? `user ${names.user.get(r.entityId) ?? ''}`
							: r.entity === 'severity_limits'
								? `severity limits ${r.entityId.replace('/', ', ')} support`
								: r.entity;
		const keys = [
			...new Set([...Object.keys(r.before ?? {}), ...Object.keys(r.after ?? {})])
		].filter((k) => !CONTEXT.has(k));
		return {
			id: r.id,
			at: r.at,
			when: dayTimeUtc(r.at),
			who: r.userName ?? 'Detune (automatic)',
			subject,
			assetId,
			action: ACTION_WORDS[r.action] ?? r.action,
			changes: keys.map((k) => ({
				field: FIELD_LABELS[k] ?? k,
				before: value(k, r.before?.[k], r, 'before'),
				after: value(k, r.after?.[k], r, 'after')
			}))
		};
	});
}
