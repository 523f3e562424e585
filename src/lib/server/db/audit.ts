/** The audit log: who changed which record, when, from what to what. */
import { and, desc, eq, sql } from 'drizzle-orm';
import { db, type Db } from './index.ts';
import { auditLog, users } from './schema.ts';

type Tx = Pick<Db, 'insert'>;

export interface AuditEntry {
	userId: string | null;
	entity: 'user' | 'asset' | 'excitation_source' | 'rule_set' | 'site' | 'check' | 'follow_up';
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

export function forEntity(entity: AuditEntry['entity'], entityId: string, limit = 100) {
	return db
		.select({
			id: auditLog.id,
			at: auditLog.at,
			action: auditLog.action,
			before: auditLog.before,
			after: auditLog.after,
			userName: users.name
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.userId))
		.where(and(eq(auditLog.entity, entity), eq(auditLog.entityId, entityId)))
		.orderBy(desc(auditLog.at), desc(auditLog.id))
		.limit(limit)
		.all();
}

export function recent(limit = 200) {
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
		.orderBy(desc(auditLog.at), desc(auditLog.id))
		.limit(limit)
		.all();
}

/** Changes to an asset and to its excitation sources, newest first. */
export function forAsset(assetId: string, limit = 100) {
	return db
		.select({
			id: auditLog.id,
			at: auditLog.at,
			entity: auditLog.entity,
			action: auditLog.action,
			before: auditLog.before,
			after: auditLog.after,
			userName: users.name
		})
		.from(auditLog)
		.leftJoin(users, eq(users.id, auditLog.userId))
		.where(
			sql`(${auditLog.entity} = 'asset' and ${auditLog.entityId} = ${assetId}) or (${auditLog.entity} = 'excitation_source' and (json_extract(${auditLog.before}, '$.asset') = ${assetId} or json_extract(${auditLog.after}, '$.asset') = ${assetId}))`
		)
		.orderBy(desc(auditLog.at), desc(auditLog.id))
		.limit(limit)
		.all();
}
