/**
 * The outbox and the sync client: the one module that writes to the outbox. A saved check waits
 * in IndexedDB until the server has acknowledged it (applied or duplicate); a rejected one stays,
 * with the server's reason, until it is fixed or discarded. Pushes run oldest first, on demand, on
 * reconnect and on a timer that backs off after failures.
 */
import { withParams } from '../url.ts';
import {
	offlineDb,
	getMeta,
	setMeta,
	applyPull,
	type OutboxItem,
	type PendingRecording
} from './store.ts';
import {
	MAX_PUSH_ITEMS,
	type CheckPush,
	type PushResponse,
	type PullResponse
} from '../schemas/sync.ts';

export type SyncState = 'idle' | 'syncing' | 'offline' | 'signed-out' | 'error';

const BATCH = Math.min(20, MAX_PUSH_ITEMS);
const BASE_DELAY = 5_000;
const MAX_DELAY = 5 * 60_000;
const TIMER = 60_000;

function isOutboxItem(v: unknown): v is OutboxItem {
	return (
		typeof v === 'object' &&
		v !== null &&
		typeof (v as OutboxItem).id === 'string' &&
		typeof (v as OutboxItem).payload === 'object'
	);
}

export class SyncManager {
	items = $state<OutboxItem[]>([]);
	state = $state<SyncState>('idle');
	message = $state<string | null>(null);
	lastSyncAt = $state<number | null>(null);
	lastPullAt = $state<number | null>(null);
	#failures = 0;
	#timer: ReturnType<typeof setTimeout> | null = null;
	#running: Promise<void> | null = null;
	#started = false;
	/** called after a pull changed the local asset data */
	onPulled: (() => void) | null = null;

	pending = $derived(this.items.filter((i) => i.status === 'pending'));
	rejected = $derived(this.items.filter((i) => i.status === 'rejected'));
	oldestAt = $derived(this.items.length ? Math.min(...this.items.map((i) => i.createdAt)) : null);

	/** Reads the outbox and starts listening for the network. Safe to call more than once. */
	async start(): Promise<void> {
		await this.refresh();
		this.lastSyncAt = (await getMeta<number>('lastSyncAt')) ?? null;
		this.lastPullAt = (await getMeta<number>('lastPullAt')) ?? null;
		if (this.#started) return;
		this.#started = true;
		if (!navigator.onLine) this.state = 'offline';
		window.addEventListener('online', () => {
			this.state = 'idle';
			this.#failures = 0;
			void this.syncNow();
		});
		window.addEventListener('offline', () => {
			this.state = 'offline';
		});
		this.#schedule(1_000);
	}

	async refresh(): Promise<void> {
		const all = await (await offlineDb()).getAllFromIndex('outbox', 'createdAt');
		this.items = all.filter(isOutboxItem);
	}

	async add(
		payload: CheckPush,
		display: OutboxItem['display'],
		recordings: PendingRecording[] = []
	): Promise<void> {
		const item: OutboxItem = {
			id: payload.id,
			createdAt: Date.now(),
			payload,
			status: 'pending',
			reason: null,
			attempts: 0,
			lastAttemptAt: null,
			display,
			recordings
		};
		await (await offlineDb()).put('outbox', item);
		await this.refresh();
		this.#schedule(500);
	}

	async discard(id: string): Promise<void> {
		await (await offlineDb()).delete('outbox', id);
		await this.refresh();
	}

	/** Puts a rejected item back in line (after the technician fixed what it lacked). */
	async retry(id: string, payload?: CheckPush): Promise<void> {
		const db = await offlineDb();
		const item = await db.get('outbox', id);
		if (!item) return;
		await db.put('outbox', {
			...item,
			payload: payload ?? item.payload,
			status: 'pending',
			reason: null
		});
		await this.refresh();
		this.#schedule(200);
	}

	async clientId(): Promise<string> {
		let id = await getMeta<string>('clientId');
		if (!id) {
			id = crypto.randomUUID();
			await setMeta('clientId', id);
		}
		return id;
	}

	/** Push everything pending, then pull. One run at a time. */
	syncNow(): Promise<void> {
		this.#running ??= this.#run().finally(() => {
			this.#running = null;
		});
		return this.#running;
	}

	async #run(): Promise<void> {
		if (!navigator.onLine) {
			this.state = 'offline';
			return;
		}
		this.state = 'syncing';
		this.message = null;
		try {
			const pushed = await this.#pushAll();
			if (pushed === 'stop') return;
			await this.pull();
			this.#failures = 0;
			this.state = 'idle';
			this.lastSyncAt = Date.now();
			await setMeta('lastSyncAt', this.lastSyncAt);
		} catch (e) {
			if ((this.state as SyncState) !== 'signed-out')
				this.#fail(e instanceof Error ? e.message : String(e));
		} finally {
			if (this.pending.length > 0 && (this.state as SyncState) !== 'signed-out')
				this.#schedule(this.#delay());
		}
	}

	#delay(): number {
		return this.#failures === 0
			? TIMER
			: Math.min(MAX_DELAY, BASE_DELAY * 2 ** (this.#failures - 1));
	}

	#fail(message: string): void {
		this.#failures++;
		this.state = navigator.onLine ? 'error' : 'offline';
		this.message = navigator.onLine
			? `${message} Next try in ${Math.round(this.#delay() / 1000)} s.`
			: 'Offline: checks wait in the outbox.';
	}

	#schedule(ms: number): void {
		if (this.#timer) clearTimeout(this.#timer);
		this.#timer = setTimeout(() => {
			this.#timer = null;
			if (this.pending.length > 0 || this.lastPullAt === null) void this.syncNow();
		}, ms);
	}

	/** 'stop' when the run must end here (signed out, server fault, network down). */
	async #pushAll(): Promise<'done' | 'stop'> {
		const clientId = await this.clientId();
		const db = await offlineDb();
		for (;;) {
			await this.refresh();
			const candidates = this.pending.slice(0, BATCH);
			if (candidates.length === 0) return 'done';
			// recordings first: a check names files the server must already hold
			const uploads = await this.#uploadRecordings(candidates);
			if (uploads === 'stop') return 'stop';
			await this.refresh();
			const batch = this.pending.filter((p) => candidates.some((c) => c.id === p.id));
			if (batch.length === 0) continue;
			let res: Response;
			try {
				res = await fetch('/api/sync/push', {
					method: 'POST',
					headers: { 'content-type': 'application/json' },
					body: JSON.stringify({ clientId, items: batch.map((b) => b.payload) })
				});
			} catch {
				this.#fail('The server could not be reached.');
				return 'stop';
			}
			if (res.status === 401) return this.#signedOut();
			const body = (await res.json().catch(() => null)) as PushResponse | null;
			// acknowledge what the server reported, whatever the status
			for (const r of body?.results ?? []) {
				const item = batch.find((b) => b.id === r.id);
				if (!item) continue;
				if (r.status === 'applied' || r.status === 'duplicate') await db.delete('outbox', item.id);
				else
					await db.put('outbox', {
						...item,
						status: 'rejected',
						reason: r.reason ?? 'Rejected by the server.',
						attempts: item.attempts + 1,
						lastAttemptAt: Date.now()
					});
			}
			await this.refresh();
			if (!res.ok) {
				this.#fail(
					body?.error ??
						(body as { message?: string } | null)?.message ??
						`The server answered ${res.status}.`
				);
				return 'stop';
			}
		}
	}

	#signedOut(): 'stop' {
		this.state = 'signed-out';
		this.message = 'Your session ended. Sign in again to sync; your checks stay on this tablet.';
		return 'stop';
	}

	async #uploadRecordings(items: OutboxItem[]): Promise<'ok' | 'stop'> {
		const db = await offlineDb();
		for (const item of items) {
			for (const rec of item.recordings ?? []) {
				if (rec.uploaded) continue;
				const q = withParams(
					{ id: rec.id, assetId: rec.assetId, name: rec.fileName },
					{
						sampleRateHz: rec.sampleRateHz ? String(rec.sampleRateHz) : null
					}
				);
				let res: Response;
				try {
					res = await fetch(`/api/recordings?${q}`, {
						method: 'POST',
						headers: { 'content-type': rec.mediaType || 'application/octet-stream' },
						body: rec.file
					});
				} catch {
					this.#fail('The server could not be reached.');
					return 'stop';
				}
				if (res.status === 401) return this.#signedOut();
				const fresh = (await db.get('outbox', item.id)) ?? item;
				if (res.ok) {
					await db.put('outbox', {
						...fresh,
						recordings: (fresh.recordings ?? []).map((r) =>
							r.id === rec.id ? { ...r, uploaded: true } : r
						)
					});
				} else if (res.status >= 400 && res.status < 500) {
					const body = (await res.json().catch(() => null)) as { message?: string } | null;
					await db.put('outbox', {
						...fresh,
						status: 'rejected',
						reason: `Recording ${rec.fileName}: ${body?.message ?? `refused (${res.status})`}`,
						attempts: fresh.attempts + 1,
						lastAttemptAt: Date.now()
					});
				} else {
					this.#fail(`Uploading ${rec.fileName} failed (${res.status}).`);
					return 'stop';
				}
			}
		}
		return 'ok';
	}

	async pull(): Promise<void> {
		const since = (await getMeta<number>('cursor')) ?? 0;
		const res = await fetch(`/api/sync/pull?since=${since}`);
		if (res.status === 401) {
			this.state = 'signed-out';
			this.message = 'Your session ended. Sign in again to refresh the asset list.';
			throw new Error('signed out');
		}
		if (!res.ok) throw new Error(`Refreshing assets failed (${res.status}).`);
		const body = (await res.json()) as PullResponse;
		await applyPull(body);
		this.lastPullAt = Date.now();
		this.onPulled?.();
	}
}

export const syncManager = new SyncManager();
