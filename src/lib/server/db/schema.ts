/**
 * The one Drizzle schema. Ids are text (UUIDs made by whoever creates the row: the tablet for a
 * check, the server for the rest), so the sync protocol never depends on one node's sequence.
 * Syncable tables carry `version` (a monotonically increasing change number, see sync_state) and
 * `updatedAt`. Assets and rule sets are never deleted (there is no delete path), so there are no
 * tombstones: an asset leaves a tablet when it leaves the user's scope, which a pull reports.
 * Times are integers in milliseconds since the epoch (UTC).
 */
import {
	sqliteTable,
	text,
	integer,
	real,
	index,
	uniqueIndex,
	primaryKey
} from 'drizzle-orm/sqlite-core';

import { sql } from 'drizzle-orm';
import { ROLES } from '../../roles.ts';
import { FREQUENCY_UNITS } from '../../frequency.ts';
export { ROLES, type Role } from '../../roles.ts';

const timestamps = {
	createdAt: integer('created_at').notNull(),
	updatedAt: integer('updated_at').notNull()
};

export const users = sqliteTable(
	'users',
	{
		id: text('id').primaryKey(),
		email: text('email').notNull(),
		name: text('name').notNull(),
		role: text('role', { enum: ROLES }).notNull(),
		passwordHash: text('password_hash').notNull(),
		disabled: integer('disabled', { mode: 'boolean' }).notNull().default(false),
		unitSystem: text('unit_system', { enum: ['metric', 'us'] })
			.notNull()
			.default('metric'),
		/** how this user reads natural and forcing frequencies; stored values are Hz either way */
		frequencyUnit: text('frequency_unit', { enum: FREQUENCY_UNITS }).notNull().default('Hz'),
		...timestamps
	},
	(t) => [uniqueIndex('users_email_idx').on(t.email)]
);

export const sessions = sqliteTable(
	'sessions',
	{
		id: text('id').primaryKey(),
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: integer('expires_at').notNull()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const sites = sqliteTable('sites', {
	id: text('id').primaryKey(),
	code: text('code').notNull().unique(),
	name: text('name').notNull(),
	/** days after which a check is flagged stale */
	recheckDays: integer('recheck_days').notNull().default(180),
	lineFrequencyHz: real('line_frequency_hz').notNull().default(60),
	version: integer('version').notNull().default(0),
	...timestamps
});

export const userSites = sqliteTable(
	'user_sites',
	{
		userId: text('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		siteId: text('site_id')
			.notNull()
			.references(() => sites.id, { onDelete: 'cascade' })
	},
	(t) => [primaryKey({ columns: [t.userId, t.siteId] })]
);

export const areas = sqliteTable(
	'areas',
	{
		id: text('id').primaryKey(),
		siteId: text('site_id')
			.notNull()
			.references(() => sites.id),
		name: text('name').notNull(),
		version: integer('version').notNull().default(0),
		...timestamps
	},
	(t) => [index('areas_site_idx').on(t.siteId)]
);

export const ruleSets = sqliteTable('rule_sets', {
	id: text('id').primaryKey(),
	name: text('name').notNull(),
	kind: text('kind', { enum: ['fixed', 'amplification'] }).notNull(),
	/** fixed rule: the default required margin, % */
	percent: real('percent'),
	/** fixed rule: JSON object excitation kind → % */
	perKind: text('per_kind', { mode: 'json' }).$type<Record<string, number>>(),
	source: text('source').notNull(),
	edition: text('edition').notNull().default(''),
	version: integer('version').notNull().default(0),
	...timestamps
});

import { MACHINE_KINDS_LIST as MACHINE_KINDS } from '../../schemas/shared-enums.ts';
export { MACHINE_KINDS };
export const DRIVE_TYPES = ['fixed', 'vfd'] as const;
import { MACHINE_GROUPS } from '../../rules/severity-limits.ts';
export { MACHINE_GROUPS };
export const ZONES = ['A', 'B', 'C', 'D'] as const;

/** Vibration severity zone boundaries per machine group and support, mm/s r.m.s. (editable). */
export const severityLimits = sqliteTable(
	'severity_limits',
	{
		machineGroup: text('machine_group', { enum: MACHINE_GROUPS }).notNull(),
		support: text('support', { enum: ['rigid', 'flexible'] }).notNull(),
		abMmS: real('ab_mm_s').notNull(),
		bcMmS: real('bc_mm_s').notNull(),
		cdMmS: real('cd_mm_s').notNull(),
		source: text('source').notNull(),
		updatedAt: integer('updated_at').notNull()
	},
	(t) => [primaryKey({ columns: [t.machineGroup, t.support] })]
);

export const assets = sqliteTable(
	'assets',
	{
		id: text('id').primaryKey(),
		tag: text('tag').notNull(),
		name: text('name').notNull(),
		siteId: text('site_id')
			.notNull()
			.references(() => sites.id),
		areaId: text('area_id').references(() => areas.id),
		machineKind: text('machine_kind', { enum: MACHINE_KINDS }).notNull(),
		driveType: text('drive_type', { enum: DRIVE_TYPES }).notNull(),
		minRpm: real('min_rpm').notNull(),
		maxRpm: real('max_rpm').notNull(),
		nominalRpm: real('nominal_rpm'),
		motorPoles: integer('motor_poles'),
		/** the induction motor's slip at rated load, % (nameplate: (n_sync − n_rated)/n_sync); null: not known */
		slipPct: real('slip_pct'),
		/** motor rpm per reference-shaft rpm (belt or gearbox); 1 for direct drive */
		driveRatio: real('drive_ratio').notNull().default(1),
		skipBands: integer('skip_bands').notNull().default(3),
		ruleSetId: text('rule_set_id').references(() => ruleSets.id),
		/** the vibration severity machine group (group1, group2); null: no zone is given */
		machineGroup: text('machine_group', { enum: MACHINE_GROUPS }),
		notes: text('notes').notNull().default(''),
		version: integer('version').notNull().default(0),
		...timestamps
	},
	(t) => [
		uniqueIndex('assets_tag_idx').on(t.tag),
		index('assets_site_idx').on(t.siteId, t.areaId),
		index('assets_version_idx').on(t.version)
	]
);

export const excitationSources = sqliteTable(
	'excitation_sources',
	{
		id: text('id').primaryKey(),
		assetId: text('asset_id')
			.notNull()
			.references(() => assets.id, { onDelete: 'cascade' }),
		kind: text('kind').notNull(),
		label: text('label').notNull().default(''),
		/** the kind's fields (counts, geometry, orders …), validated by the shared zod schema */
		params: text('params', { mode: 'json' }).notNull().$type<Record<string, unknown>>(),
		sortOrder: integer('sort_order').notNull().default(0),
		version: integer('version').notNull().default(0),
		...timestamps
	},
	(t) => [index('sources_asset_idx').on(t.assetId), index('sources_version_idx').on(t.version)]
);

/** Single-row counter of the change number handed to syncable rows. */
export const syncState = sqliteTable('sync_state', {
	id: integer('id').primaryKey(),
	version: integer('version').notNull()
});

export const VERDICTS = ['clear', 'tight', 'conflict', 'unchecked'] as const;

export const checks = sqliteTable(
	'checks',
	{
		/** made by the tablet: the idempotency key of sync */
		id: text('id').primaryKey(),
		assetId: text('asset_id')
			.notNull()
			.references(() => assets.id),
		userId: text('user_id')
			.notNull()
			.references(() => users.id),
		/** when the technician saved it on the device */
		checkedAt: integer('checked_at').notNull(),
		/** when the server stored it */
		receivedAt: integer('received_at').notNull(),
		measuredRpm: real('measured_rpm'),
		driveSetpointHz: real('drive_setpoint_hz'),
		notes: text('notes').notNull().default(''),
		replacesCheckId: text('replaces_check_id'),
		ruleSetId: text('rule_set_id').references(() => ruleSets.id),
		/** the rule as applied, so a later edit of the rule set does not rewrite history silently */
		ruleSnapshot: text('rule_snapshot', { mode: 'json' }).$type<Record<string, unknown>>(),
		verdict: text('verdict', { enum: VERDICTS }).notNull(),
		verdictAtSpeed: text('verdict_at_speed', { enum: VERDICTS }).notNull(),
		worstMarginAtSpeedPct: real('worst_margin_at_speed_pct'),
		worstMarginOverRangePct: real('worst_margin_over_range_pct'),
		worstPair: text('worst_pair'),
		/** the worst pair's natural frequency (Hz) and forcing label, so each reader's unit shows it */
		worstNaturalHz: real('worst_natural_hz'),
		worstLabel: text('worst_label'),
		/** the server's result of record (pairs, bands) */
		result: text('result', { mode: 'json' }).$type<Record<string, unknown>>(),
		/** what the device showed, kept when it differs from the server's */
		deviceResult: text('device_result', { mode: 'json' }).$type<Record<string, unknown>>(),
		resultDiffers: integer('result_differs', { mode: 'boolean' }).notNull().default(false),
		reviewedBy: text('reviewed_by').references(() => users.id),
		reviewedAt: integer('reviewed_at'),
		reviewComment: text('review_comment'),
		/** "fine" (comment optional) or "remarks" (a comment says what) */
		reviewOutcome: text('review_outcome', { enum: ['fine', 'remarks'] }),
		/** overall vibration velocity, mm/s r.m.s., and the zone the server gave it (null: none) */
		overallVelocityMmS: real('overall_velocity_mm_s'),
		severityZone: text('severity_zone', { enum: ZONES }),
		/** how the zone was reached: support, band and the limits applied */
		severity: text('severity', { mode: 'json' }).$type<Record<string, unknown>>()
	},
	(t) => [
		index('checks_asset_idx').on(t.assetId, t.checkedAt),
		index('checks_user_idx').on(t.userId)
	]
);

export {
	DIRECTIONS_LIST as DIRECTIONS,
	MODE_ORIGINS_LIST as MODE_ORIGINS
} from '../../schemas/shared-enums.ts';
import {
	DIRECTIONS_LIST as DIRECTIONS,
	MODE_ORIGINS_LIST as MODE_ORIGINS
} from '../../schemas/shared-enums.ts';

export const modes = sqliteTable(
	'modes',
	{
		id: text('id').primaryKey(),
		checkId: text('check_id')
			.notNull()
			.references(() => checks.id, { onDelete: 'cascade' }),
		frequencyHz: real('frequency_hz').notNull(),
		dampingRatio: real('damping_ratio'),
		direction: text('direction', { enum: DIRECTIONS }),
		location: text('location'),
		origin: text('origin', { enum: MODE_ORIGINS }).notNull(),
		recordingId: text('recording_id')
	},
	(t) => [index('modes_check_idx').on(t.checkId)]
);

export const recordings = sqliteTable(
	'recordings',
	{
		id: text('id').primaryKey(),
		checkId: text('check_id').references(() => checks.id),
		assetId: text('asset_id')
			.notNull()
			.references(() => assets.id),
		sha256: text('sha256').notNull(),
		fileName: text('file_name').notNull(),
		sizeBytes: integer('size_bytes').notNull(),
		mediaType: text('media_type').notNull(),
		sampleRateHz: real('sample_rate_hz'),
		channels: integer('channels'),
		durationS: real('duration_s'),
		analysis: text('analysis', { mode: 'json' }).$type<Record<string, unknown>>(),
		deviceAnalysis: text('device_analysis', { mode: 'json' }).$type<Record<string, unknown>>(),
		analysisDiffers: integer('analysis_differs', { mode: 'boolean' }).notNull().default(false),
		createdAt: integer('created_at').notNull()
	},
	(t) => [index('recordings_asset_idx').on(t.assetId), index('recordings_hash_idx').on(t.sha256)]
);

export const FOLLOW_UP_STATUSES = ['open', 'scheduled', 'done', 'retested'] as const;
export const PRIORITIES = ['low', 'normal', 'high', 'urgent'] as const;

export const followUps = sqliteTable(
	'follow_ups',
	{
		id: text('id').primaryKey(),
		assetId: text('asset_id')
			.notNull()
			.references(() => assets.id),
		checkId: text('check_id').references(() => checks.id),
		createdBy: text('created_by')
			.notNull()
			.references(() => users.id),
		assigneeId: text('assignee_id').references(() => users.id),
		title: text('title').notNull(),
		remedy: text('remedy', { mode: 'json' }).$type<Record<string, unknown>>(),
		status: text('status', { enum: FOLLOW_UP_STATUSES }).notNull().default('open'),
		priority: text('priority', { enum: PRIORITIES }).notNull().default('normal'),
		/** due date as YYYY-MM-DD (a plant's calendar day, not an instant) */
		dueDate: text('due_date'),
		notes: text('notes').notNull().default(''),
		retestCheckId: text('retest_check_id').references(() => checks.id),
		...timestamps
	},
	(t) => [
		index('follow_ups_asset_idx').on(t.assetId, t.status),
		index('follow_ups_assignee_idx').on(t.assigneeId, t.status)
	]
);

/** Outgoing mail as sent, and — in development — every message the local SMTP catcher received. */
export const mail = sqliteTable(
	'mail',
	{
		id: text('id').primaryKey(),
		/** idempotency key: never the same mail twice (e.g. "overdue:<followUpId>:<dueDate>") */
		dedupeKey: text('dedupe_key'),
		kind: text('kind').notNull(),
		toAddress: text('to_address').notNull(),
		subject: text('subject').notNull(),
		textBody: text('text_body').notNull(),
		htmlBody: text('html_body'),
		raw: text('raw'),
		status: text('status', { enum: ['queued', 'sent', 'failed', 'received'] }).notNull(),
		error: text('error'),
		createdAt: integer('created_at').notNull()
	},
	(t) => [uniqueIndex('mail_dedupe_idx').on(t.dedupeKey)]
);

export const auditLog = sqliteTable(
	'audit_log',
	{
		id: integer('id').primaryKey({ autoIncrement: true }),
		at: integer('at').notNull(),
		userId: text('user_id').references(() => users.id),
		entity: text('entity').notNull(),
		entityId: text('entity_id').notNull(),
		action: text('action').notNull(),
		before: text('before', { mode: 'json' }).$type<Record<string, unknown> | null>(),
		after: text('after', { mode: 'json' }).$type<Record<string, unknown> | null>()
	},
	(t) => [index('audit_entity_idx').on(t.entity, t.entityId, t.at), index('audit_at_idx').on(t.at)]
);

export type User = typeof users.$inferSelect;
export type Site = typeof sites.$inferSelect;
export type Area = typeof areas.$inferSelect;
export type Asset = typeof assets.$inferSelect;
export type ExcitationSourceRow = typeof excitationSources.$inferSelect;
export type RuleSetRow = typeof ruleSets.$inferSelect;
export type CheckRow = typeof checks.$inferSelect;
export type ModeRow = typeof modes.$inferSelect;

/**
 * The board's row per asset: its latest check, re-evaluated against today's asset data and rule
 * set (so an edit or a rule change shows at once), kept up to date in the same transaction as the
 * write that changes it. The check rows themselves stay as they were computed (the record).
 */
export const assetStatus = sqliteTable(
	'asset_status',
	{
		assetId: text('asset_id')
			.primaryKey()
			.references(() => assets.id, { onDelete: 'cascade' }),
		latestCheckId: text('latest_check_id').references(() => checks.id),
		checkedAt: integer('checked_at'),
		checkedBy: text('checked_by'),
		measuredRpm: real('measured_rpm'),
		verdict: text('verdict', { enum: VERDICTS }).notNull().default('unchecked'),
		/** 0 unchecked, 1 clear, 2 tight, 3 conflict: for sorting worst first */
		verdictRank: integer('verdict_rank').notNull().default(0),
		worstMarginAtSpeedPct: real('worst_margin_at_speed_pct'),
		worstMarginOverRangePct: real('worst_margin_over_range_pct'),
		worstPair: text('worst_pair'),
		/** the worst pair's natural frequency (Hz) and forcing label, so each reader's unit shows it */
		worstNaturalHz: real('worst_natural_hz'),
		worstLabel: text('worst_label'),
		openFollowUps: integer('open_follow_ups').notNull().default(0),
		/** the latest check's overall velocity and zone; zone_rank 0 D … 3 A, 4 none (worst first) */
		overallVelocityMmS: real('overall_velocity_mm_s'),
		severityZone: text('severity_zone', { enum: ZONES }),
		zoneRank: integer('zone_rank').notNull().default(4),
		updatedAt: integer('updated_at').notNull(),
		// copies of the asset's board columns, so the board filters and sorts one table with indexes
		siteId: text('site_id').notNull().default(''),
		areaId: text('area_id'),
		machineKind: text('machine_kind').notNull().default('other'),
		tag: text('tag').notNull().default(''),
		name: text('name').notNull().default(''),
		/** the site's name, so that "by site" reads an index instead of sorting every asset */
		siteName: text('site_name').notNull().default(''),
		/** checked_at + the site's recheck interval: stale once now passes it */
		staleAfter: integer('stale_after'),
		/** change number (sync_state) of the last write, so a pull sends a tablet the new latest check */
		version: integer('version').notNull().default(0)
	},
	(t) => [
		index('status_worst_idx').on(t.verdictRank, t.worstMarginOverRangePct),
		// the board's zone order and filter
		index('status_zone_idx').on(t.zoneRank, t.verdictRank, t.worstMarginOverRangePct),
		index('status_checked_idx').on(t.checkedAt),
		index('status_site_worst_idx').on(t.siteId, t.verdictRank, t.worstMarginOverRangePct),
		index('status_verdict_idx').on(t.verdict, t.staleAfter),
		index('status_tag_idx').on(t.tag),
		index('status_version_idx').on(t.version),
		// counts by kind, by site and within one verdict, read from an index each (at 100,000
		// assets: 1.5 ms instead of 88 ms for one kind); and every board order but name and
		// follow-ups as an index, alone and within a verdict tab, so that the first page is read
		// in order instead of sorting every asset (SQLite reads "asc nulls last" from a plain index)
		index('status_kind_verdict_idx').on(t.machineKind, t.verdict, t.staleAfter),
		index('status_site_verdict_idx').on(t.siteId, t.verdict, t.staleAfter),
		index('status_verdict_board_idx').on(
			t.verdict,
			sql`${t.verdictRank} desc`,
			t.worstMarginOverRangePct,
			t.tag
		),
		index('status_verdict_tag_idx').on(t.verdict, t.tag),
		index('status_site_name_idx').on(t.siteName, t.tag),
		index('status_verdict_site_name_idx').on(t.verdict, t.siteName, t.tag),
		index('status_over_range_idx').on(t.worstMarginOverRangePct, t.tag),
		index('status_verdict_over_range_idx').on(t.verdict, t.worstMarginOverRangePct, t.tag),
		index('status_at_speed_idx').on(t.worstMarginAtSpeedPct, t.tag),
		index('status_verdict_at_speed_idx').on(t.verdict, t.worstMarginAtSpeedPct, t.tag),
		index('status_checked_tag_idx').on(t.checkedAt, t.tag),
		index('status_verdict_checked_idx').on(t.verdict, t.checkedAt, t.tag)
	]
);
