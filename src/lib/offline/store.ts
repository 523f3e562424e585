/**
 * The tablet's IndexedDB (idb), one database per user, so that a shared tablet never shows one
 * technician's assets to another or sends one's checks under another's name:
 * - `detune-user-<id>`: the assets, sources and rule sets pulled for that user, their outbox, their
 *   drafts (the check being typed, per asset), their recent assets and checks, sync bookkeeping;
 * - `detune-device`: who is signed in on this tablet (see session.ts).
 * Only outbox.svelte.ts writes to the outbox.
 */
import type { SweepChoice } from '../recordings/sweep.ts';
import { deleteDB, openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type {
	CheckPush,
	ModeInput,
	PulledAsset,
	PulledRuleSet,
	PullResponse
} from '../schemas/sync.ts';

export interface OutboxItem {
	id: string;
	/** the user who saved it: only their session sends it */
	authorId: string;
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
	/** a record of the running machine (subtracted from a bump test's spectrum), or a speed sweep */
	role?: 'background' | 'sweep';
	/** a sweep's channel roles and orders, which the server analyses it with again */
	sweep?: SweepChoice;
	/** the background recording this one was analysed with (uploaded before it) */
	backgroundId?: string;
}

/** The check being typed for one asset, kept as it is typed until it is saved or discarded. */
export interface Draft {
	assetId: string;
	rpmText: string;
	setpointText: string;
	/** the overall vibration level typed (mm/s r.m.s.); absent in drafts of older versions */
	velocityText?: string;
	/** the technician confirmed a speed outside the asset's range (for this rpm text) */
	outsideRangeConfirmedFor: string | null;
	modes: ModeInput[];
	notes: string;
	recordings: PendingRecording[];
	replacesCheckId: string | null;
	updatedAt: number;
}

/** A check this user saved on this tablet, for "your recent checks". */
export interface HistoryEntry {
	id: string;
	assetId: string;
	tag: string;
	name: string;
	verdict: string;
	measuredRpm: number;
	savedAt: number;
}

interface UserDB extends DBSchema {
	assets: { key: string; value: PulledAsset };
	ruleSets: { key: string; value: PulledRuleSet };
	outbox: { key: string; value: OutboxItem; indexes: { createdAt: number } };
	recent: { key: string; value: { assetId: string; usedAt: number } };
	drafts: { key: string; value: Draft };
	history: { key: string; value: HistoryEntry; indexes: { savedAt: number } };
	meta: { key: string; value: unknown };
}

export type UserDb = IDBPDatabase<UserDB>;
export const userDbName = (userId: string) => `detune-user-${userId}`;
/** the single, shared database of versions before per-user storage */
export const LEGACY_DB_NAME = 'detune-offline';
const HISTORY_KEEP = 30;

const opened = new Map<string, Promise<UserDb>>();

export function userDb(userId: string): Promise<UserDb> {
	let db = opened.get(userId);
	if (!db) {
		db = openDB<UserDB>(userDbName(userId), 1, {
			upgrade(d) {
				d.createObjectStore('assets', { keyPath: 'id' });
				d.createObjectStore('ruleSets', { keyPath: 'id' });
				d.createObjectStore('outbox', { keyPath: 'id' }).createIndex('createdAt', 'createdAt');
				d.createObjectStore('recent', { keyPath: 'assetId' });
				d.createObjectStore('drafts', { keyPath: 'assetId' });
				d.createObjectStore('history', { keyPath: 'id' }).createIndex('savedAt', 'savedAt');
				d.createObjectStore('meta');
			}
		});
		opened.set(userId, db);
	}
	return db;
}

/** How many checks wait in a user's outbox on this tablet (for the sign-out prompt). */
export async function waitingChecks(userId: string): Promise<number> {
	return (await userDb(userId)).count('outbox');
}

/** One user's stored data, as the Floor check screen and the sync client read and write it. */
export class UserStore {
	constructor(
		readonly userId: string,
		readonly db: UserDb
	) {}

	static async open(userId: string): Promise<UserStore> {
		const store = new UserStore(userId, await userDb(userId));
		await store.#adoptLegacy();
		return store;
	}

	async getMeta<T>(key: string): Promise<T | undefined> {
		return (await this.db.get('meta', key)) as T | undefined;
	}

	async setMeta(key: string, value: unknown): Promise<void> {
		await this.db.put('meta', value, key);
	}

	allAssets = () => this.db.getAll('assets');
	allRuleSets = () => this.db.getAll('ruleSets');

	async recentAssets(): Promise<Map<string, number>> {
		const rows = await this.db.getAll('recent');
		return new Map(rows.map((r) => [r.assetId, r.usedAt]));
	}

	async markRecent(assetId: string): Promise<void> {
		await this.db.put('recent', { assetId, usedAt: Date.now() });
	}

	async history(): Promise<HistoryEntry[]> {
		return (await this.db.getAllFromIndex('history', 'savedAt')).reverse();
	}

	async addHistory(entry: HistoryEntry): Promise<void> {
		const tx = this.db.transaction('history', 'readwrite');
		await tx.store.put(entry);
		const keys = await tx.store.index('savedAt').getAllKeys();
		for (const k of keys.slice(0, Math.max(0, keys.length - HISTORY_KEEP)))
			await tx.store.delete(k);
		await tx.done;
	}

	draft = (assetId: string) => this.db.get('drafts', assetId);

	async saveDraft(draft: Draft): Promise<void> {
		await this.db.put('drafts', draft);
	}

	async discardDraft(assetId: string): Promise<void> {
		await this.db.delete('drafts', assetId);
	}

	async draftAssetIds(): Promise<Set<string>> {
		return new Set(await this.db.getAllKeys('drafts'));
	}

	/** Stores a pull: a full one replaces the assets and rule sets, a delta merges. */
	async applyPull(p: PullResponse): Promise<void> {
		const tx = this.db.transaction(['assets', 'ruleSets', 'meta'], 'readwrite');
		if (p.full) {
			await tx.objectStore('assets').clear();
			await tx.objectStore('ruleSets').clear();
		}
		for (const a of p.assets) await tx.objectStore('assets').put(a);
		for (const r of p.ruleSets) await tx.objectStore('ruleSets').put(r);
		for (const d of p.deleted) await tx.objectStore('assets').delete(d.id);
		await tx.objectStore('meta').put(p.severityLimits ?? [], 'severityLimits');
		await tx.objectStore('meta').put(p.cursor, 'cursor');
		await tx.objectStore('meta').put(p.scope, 'scope');
		await tx.objectStore('meta').put(Date.now(), 'lastPullAt');
		await tx.done;
	}

	/**
	 * Checks saved before per-user storage waited in one shared outbox. The first user to open the
	 * new version on the tablet is the one whose session survived the update, so they get them.
	 */
	async #adoptLegacy(): Promise<void> {
		if (typeof indexedDB.databases !== 'function') return;
		const names = (await indexedDB.databases()).map((d) => d.name);
		if (!names.includes(LEGACY_DB_NAME)) return;
		const legacy = await openDB(LEGACY_DB_NAME);
		if (legacy.objectStoreNames.contains('outbox')) {
			const items = (await legacy.getAll('outbox')) as Omit<OutboxItem, 'authorId'>[];
			for (const item of items) await this.db.put('outbox', { ...item, authorId: this.userId });
		}
		legacy.close();
		await deleteDB(LEGACY_DB_NAME);
	}
}
