/**
 * The tablet's IndexedDB (idb): the assets, sources and rule sets pulled from the server, the
 * outbox of checks waiting to sync, recent assets and sync bookkeeping. Only outbox.svelte.ts
 * writes to the outbox.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { CheckPush, PulledAsset, PulledRuleSet } from '../schemas/sync.ts';

export interface OutboxItem {
	id: string;
	createdAt: number;
	payload: CheckPush;
	status: 'pending' | 'rejected';
	reason: string | null;
	attempts: number;
	lastAttemptAt: number | null;
	/** what the list shows without recomputing */
	display: { tag: string; name: string; verdict: string };
	/** bump-test files that travel with the check, uploaded before it */
	recordings?: PendingRecording[];
}

export interface PendingRecording {
	id: string;
	assetId: string;
	file: Blob;
	fileName: string;
	mediaType: string;
	sampleRateHz: number | null;
	uploaded: boolean;
}

interface DetuneDB extends DBSchema {
	assets: { key: string; value: PulledAsset };
	ruleSets: { key: string; value: PulledRuleSet };
	outbox: { key: string; value: OutboxItem; indexes: { createdAt: number } };
	recent: { key: string; value: { assetId: string; usedAt: number } };
	meta: { key: string; value: unknown };
}

export const DB_NAME = 'detune-offline';
let opening: Promise<IDBPDatabase<DetuneDB>> | null = null;

export function offlineDb(): Promise<IDBPDatabase<DetuneDB>> {
	opening ??= openDB<DetuneDB>(DB_NAME, 1, {
		upgrade(db) {
			db.createObjectStore('assets', { keyPath: 'id' });
			db.createObjectStore('ruleSets', { keyPath: 'id' });
			db.createObjectStore('outbox', { keyPath: 'id' }).createIndex('createdAt', 'createdAt');
			db.createObjectStore('recent', { keyPath: 'assetId' });
			db.createObjectStore('meta');
		}
	});
	return opening;
}

export async function getMeta<T>(key: string): Promise<T | undefined> {
	return (await (await offlineDb()).get('meta', key)) as T | undefined;
}

export async function setMeta(key: string, value: unknown): Promise<void> {
	await (await offlineDb()).put('meta', value, key);
}

export async function allAssets(): Promise<PulledAsset[]> {
	return (await offlineDb()).getAll('assets');
}

export async function allRuleSets(): Promise<PulledRuleSet[]> {
	return (await offlineDb()).getAll('ruleSets');
}

export async function recentAssets(): Promise<Map<string, number>> {
	const rows = await (await offlineDb()).getAll('recent');
	return new Map(rows.map((r) => [r.assetId, r.usedAt]));
}

export async function markRecent(assetId: string): Promise<void> {
	await (await offlineDb()).put('recent', { assetId, usedAt: Date.now() });
}

/** Stores a pull: a full one replaces the assets and rule sets, a delta merges. */
export async function applyPull(p: {
	full: boolean;
	assets: PulledAsset[];
	ruleSets: PulledRuleSet[];
	deleted: { entity: string; id: string }[];
	cursor: number;
}): Promise<void> {
	const db = await offlineDb();
	const tx = db.transaction(['assets', 'ruleSets', 'meta'], 'readwrite');
	if (p.full) {
		await tx.objectStore('assets').clear();
		await tx.objectStore('ruleSets').clear();
	}
	for (const a of p.assets) await tx.objectStore('assets').put(a);
	for (const r of p.ruleSets) await tx.objectStore('ruleSets').put(r);
	for (const d of p.deleted) {
		if (d.entity === 'asset') await tx.objectStore('assets').delete(d.id);
		if (d.entity === 'rule_set') await tx.objectStore('ruleSets').delete(d.id);
	}
	await tx.objectStore('meta').put(p.cursor, 'cursor');
	await tx.objectStore('meta').put(Date.now(), 'lastPullAt');
	await tx.done;
}
