/** The audit log: who changed which record, when, from what to what. */
import { and, desc, eq, sql, type SQL } from 'drizzle-orm';
import { db, type Db } from './index.ts';
import { auditLog, users } from './schema.ts';

type Tx = Pick<Db, 'insert'>;

export interface AuditEntry {
	userId: string | null;
	entity:
		| 'user'
		| 'asset'
		| 'excitation_source'
		| 'rule_set'
		| 'site'
		| 'check'
		| 'follow_up'
		| 'severity_limits';
	entityId: string;
	action: string;
	before?: Record<string, unknown> | null;
	after?: Record<string, unknown> | null;
}

/** Writes one entry inside the caller's transaction. */
export function record(tx: Tx, entry: AuditEntry, at = Date.now()): void {
	tx.insert(auditLog)
		.values({
			at,
			userId: entry.userId,
			entity: entry.entity,
			entityId: entry.entityId,
			action: entry.action,
			before: entry.before ?? null,
			after: entry.after ?? null
		})
		.run();
}

/**
 * A writer of entries by one person (`null`: Detune itself, as for a retest closed by a clear
 * check) at one time, inside the caller's transaction:
 * `audit.by(tx, actorId, now)('site', id, 'update', { before, after })`.
 */
export function by(tx: Tx, userId: string | null, at = Date.now()) {
	return (
		entity: AuditEntry['entity'],
		entityId: string,
		action: string,
		change: Pick<AuditEntry, 'before' | 'after'> = {}
	) => record(tx, { userId, entity, entityId, action, ...change }, at);
}

/** Entries with the name of who made them, newest first. */
function entries(where: SQL | undefined, limit: number) {
	return db
		.select({
			id: auditLog.id,
			at: auditLog.at,
			entity: auditLog.entity,
			entityId: auditLog.entityId,
			action: auditLog.action,
			before: auditLog.before,
			after: auditLog.after,
			userName: users.name
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.userId))
		.where(where)
		.orderBy(desc(auditLog.at), desc(auditLog.id))
		.limit(limit)
		.all();
}

export function forEntity(entity: AuditEntry['entity'], entityId: string, limit = 100) {
	return entries(and(eq(auditLog.entity, entity), eq(auditLog.entityId, entityId)), limit);
}

export interface AuditFilter {
	/** entries about this asset: the asset, its sources, its checks and its follow-ups */
	assetId?: string;
	userId?: string;
	/** from this time on, ms */
	from?: number;
	/** before this time, ms */
	to?: number;
}

/** The log, newest first, filtered. */
export function search(filter: AuditFilter, limit = 500) {
	const c = [];
	if (filter.userId) c.push(eq(auditLog.userId, filter.userId));
	if (filter.from !== undefined) c.push(sql`${auditLog.at} >= ${filter.from}`);
	if (filter.to !== undefined) c.push(sql`${auditLog.at} < ${filter.to}`);
	if (filter.assetId) {
		const a = filter.assetId;
		// raw table names: drizzle writes a subquery's columns unqualified
		c.push(
			sql`((audit_log.entity = 'asset' and audit_log.entity_id = ${a})
				or (audit_log.entity = 'excitation_source' and (json_extract(audit_log.before, '$.asset') = ${a} or json_extract(audit_log.after, '$.asset') = ${a}))
				or (audit_log.entity = 'check' and audit_log.entity_id in (select c.id from checks c where c.asset_id = ${a}))
				or (audit_log.entity = 'follow_up' and audit_log.entity_id in (select f.id from follow_ups f where f.asset_id = ${a})))`
		);
	}
	return entries(c.length ? and(...c) : undefined, limit);
}
