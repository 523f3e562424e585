/**
 * The change counter behind sync: every write to a syncable row takes the next version, so a
 * client's cursor is simply the highest version it has seen.
 */
import { eq, sql } from 'drizzle-orm';
import type { Db } from './client.ts';
import { syncState } from './schema.ts';

type Tx = Pick<Db, 'insert' | 'select' | 'update'>;

/** Takes the next version inside the caller's transaction. */
export function nextVersion(tx: Tx): number {
	tx.insert(syncState).values({ id: 1, version: 0 }).onConflictDoNothing().run();
	tx.update(syncState)
		.set({ version: sql`${syncState.version} + 1` })
		.where(eq(syncState.id, 1))
		.run();
	return (
		tx.select({ v: syncState.version }).from(syncState).where(eq(syncState.id, 1)).get() as {
			v: number;
		}
	).v;
}

export function currentVersion(tx: Pick<Db, 'select'>): number {
	return (
		tx.select({ v: syncState.version }).from(syncState).where(eq(syncState.id, 1)).get()?.v ?? 0
	);
}
