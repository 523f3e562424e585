/**
 * The outbox and the sync client: the one module that writes to the outbox. It works for one user
 * at a time (the one signed in on the tablet) on that user's own store, so nobody's checks go out
 * under anybody else's session. A saved check waits in IndexedDB until the server has acknowledged
 * it (applied or duplicate); a rejected one stays, with the server's reason, until it is fixed or
 * discarded. Pushes run oldest first, on demand, on reconnect and on a timer that backs off after
 * failures.
 */
import { withParams } from '../url.ts';
import { newId } from '../ids.ts';
import type { OutboxItem, PendingRecording, UserStore } from './store.ts';
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
	#listening = false;
	#store: UserStore | null = null;
	/** called after a pull changed the local asset data */
	onPulled: (() => void) | null = null;

	pending = $derived(this.items.filter((i) => i.status === 'pending'));
	rejected = $derived(this.items.filter((i) => i.status === 'rejected'));
	oldestAt = $derived(this.items.length ? Math.min(...this.items.map((i) => i.createdAt)) : null);

	/** The user whose store this works on. */
	get userId(): string | null {
		return this.#store?.userId ?? null;
	}

	get #db() {
		if (!this.#store) throw new Error('The outbox is not open: nobody is signed in.');
		return this.#store.db;
	}

	/**
	 * Binds to a user's store, reads their outbox and starts listening for the network. Safe to call
	 * again; with another user's store it lets go of the previous one first.
	 */
	async start(store: UserStore): Promise<void> {
		if (this.#store?.userId !== store.userId) this.stop();
		this.#store = store;
		await this.refresh();
		this.lastSyncAt = (await store.getMeta<number>('lastSyncAt')) ?? null;
		this.lastPullAt = (await store.getMeta<number>('lastPullAt')) ?? null;
		if (!navigator.onLine) this.state = 'offline';
		if (this.#listening) {
			this.#schedule(1_000);
			return;
		}
		this.#listening = true;
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

	/** Lets go of the current user's store (sign-out, or another user signed in). */
	stop(): void {
		if (this.#timer) clearTimeout(this.#timer);
		this.#timer = null;
		this.#store = null;
		this.items = [];
		this.state = 'idle';
		this.message = null;
		this.lastSyncAt = null;
		this.lastPullAt = null;
		this.#failures = 0;
	}

	async refresh(): Promise<void> {
		if (!this.#store) return;
		const all = await this.#db.getAllFromIndex('outbox', 'createdAt');
		this.items = all.filter(isOutboxItem);
	}

	async add(
		payload: Omit<CheckPush, 'authorId'>,
		display: OutboxItem['display'],
		recordings: PendingRecording[] = []
	): Promise<void> {
		const authorId = this.#store!.userId;
		const item: OutboxItem = {
			id: payload.id,
			authorId,
			createdAt: Date.now(),
			payload: { ...payload, authorId },
			status: 'pending',
			reason: null,
			attempts: 0,
			lastAttemptAt: null,
			display,
			recordings
		};
		await this.#db.put('outbox', item);
		await this.refresh();
		this.#schedule(500);
	}

	async discard(id: string): Promise<void> {
		await this.#db.delete('outbox', id);
		await this.refresh();
	}

	/** Puts a rejected item back in line (after the technician fixed what it lacked). */
	async retry(id: string, payload?: CheckPush): Promise<void> {
		const db = this.#db;
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
		let id = await this.#store!.getMeta<string>('clientId');
		if (!id) {
			id = newId();
			await this.#store!.setMeta('clientId', id);
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
		const store = this.#store;
		if (!store) return;
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
			await store.setMeta('lastSyncAt', this.lastSyncAt);
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
			if (this.#store && (this.pending.length > 0 || this.lastPullAt === null)) void this.syncNow();
		}, ms);
	}

	/** 'stop' when the run must end here (signed out, server fault, network down). */
	async #pushAll(): Promise<'done' | 'stop'> {
		const clientId = await this.clientId();
		const db = this.#db;
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
		const db = this.#db;
		for (const item of items) {
			for (const rec of item.recordings ?? []) {
				if (rec.uploaded) continue;
				const q = withParams(
					{ id: rec.id, assetId: rec.assetId, name: rec.fileName },
					{
						sampleRateHz: rec.sampleRateHz ? String(rec.sampleRateHz) : null,
						role: rec.role ?? null,
						sweep: rec.sweep ? JSON.stringify(rec.sweep) : null,
						background: rec.backgroundId ?? null
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
					// 503: the server's analysis is busy; the check stays queued for the next sync
					const body = (await res.json().catch(() => null)) as { message?: string } | null;
					this.#fail(
						res.status === 503 && body?.message
							? `${rec.fileName}: ${body.message}`
							: `Uploading ${rec.fileName} failed (${res.status}).`
					);
					return 'stop';
				}
			}
		}
		return 'ok';
	}

	async pull(): Promise<void> {
		const store = this.#store;
		if (!store) return;
		const since = (await store.getMeta<number>('cursor')) ?? 0;
		const scope = (await store.getMeta<string>('scope')) ?? null;
		const res = await fetch(`/api/sync/pull?${withParams({ since: String(since) }, { scope })}`);
		if (res.status === 401) {
			this.state = 'signed-out';
			this.message = 'Your session ended. Sign in again to refresh the asset list.';
			throw new Error('signed out');
		}
		if (!res.ok) throw new Error(`Refreshing assets failed (${res.status}).`);
		const body = (await res.json()) as PullResponse;
		// the user may have changed while the answer travelled: it belongs to the store that asked
		await store.applyPull(body);
		if (this.#store !== store) return;
		this.lastPullAt = Date.now();
		this.onPulled?.();
	}
}

export const syncManager = new SyncManager();
