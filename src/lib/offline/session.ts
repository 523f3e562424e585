/**
 * Who is signed in on this tablet, as Floor check needs to know it with or without network.
 * Online, the server's answer (GET /api/session) decides and is remembered; offline, the remembered
 * user is used. Signing out offline ends the local session at once and the server's at the next
 * contact. The local record is a convenience, not security: every API call is checked on the server.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { Role } from '../roles.ts';
import type { FrequencyUnit } from '../frequency.ts';
import { closeAllInputs } from '../capture/open-inputs.ts';

export interface LocalUser {
	id: string;
	name: string;
	email: string;
	role: Role;
	unitSystem: 'metric' | 'us';
	/** missing on a tablet that remembered its user before the choice existed: read as Hz */
	frequencyUnit?: FrequencyUnit;
}

interface DeviceDB extends DBSchema {
	meta: { key: string; value: unknown };
}

export const DEVICE_DB_NAME = 'detune-device';
let device: Promise<IDBPDatabase<DeviceDB>> | null = null;

export function deviceDb() {
	device ??= openDB<DeviceDB>(DEVICE_DB_NAME, 1, {
		upgrade(db) {
			db.createObjectStore('meta');
		}
	});
	return device;
}

function isLocalUser(v: unknown): v is LocalUser {
	const u = v as LocalUser;
	return (
		typeof v === 'object' && v !== null && typeof u.id === 'string' && typeof u.role === 'string'
	);
}

export async function rememberedUser(): Promise<LocalUser | null> {
	const v = await (await deviceDb()).get('meta', 'currentUser');
	return isLocalUser(v) ? v : null;
}

export async function remember(user: LocalUser): Promise<void> {
	const db = await deviceDb();
	await db.put('meta', user, 'currentUser');
	await db.delete('meta', 'pendingSignOut');
}

export type Resolved =
	| { user: LocalUser; source: 'server' | 'tablet' }
	| { user: null; reason: 'signed-out' | 'offline-signed-out' };

/** The user to open Floor check for: the server's when it answers, else the remembered one. */
export async function resolveUser(): Promise<Resolved> {
	await endPendingSignOut();
	try {
		const res = await fetch('/api/session', { headers: { accept: 'application/json' } });
		if (res.status === 401) {
			await forget();
			return { user: null, reason: 'signed-out' };
		}
		if (res.ok) {
			const user = (await res.json()) as LocalUser;
			await remember(user);
			return { user, source: 'server' };
		}
	} catch {
		/* no network: fall back to the tablet */
	}
	const user = await rememberedUser();
	return user ? { user, source: 'tablet' } : { user: null, reason: 'offline-signed-out' };
}

async function forget(): Promise<void> {
	await (await deviceDb()).delete('meta', 'currentUser');
}

/**
 * Signs out on this tablet: the local session ends now; the server's at once when it can be
 * reached, otherwise at the next contact (see endPendingSignOut). Then the sign-in page, which the
 * service worker keeps for offline use.
 */
export async function signOut(): Promise<void> {
	// a tap capture's audio input closes first: the tablet stops listening before anyone else
	closeAllInputs();
	await forget();
	await (await deviceDb()).put('meta', true, 'pendingSignOut');
	await endPendingSignOut();
	location.assign('/login');
}

/** Ends a server session that a sign-out on an offline tablet left open. */
export async function endPendingSignOut(): Promise<void> {
	const db = await deviceDb();
	if (!(await db.get('meta', 'pendingSignOut'))) return;
	try {
		const res = await fetch('/logout', {
			method: 'POST',
			body: new FormData(),
			redirect: 'manual'
		});
		if (res.type === 'opaqueredirect' || res.ok) await db.delete('meta', 'pendingSignOut');
	} catch {
		/* still offline: try again at the next contact */
	}
}

/** Called when a sign-in succeeded: an older pending sign-out must not end the new session. */
export async function clearPendingSignOut(): Promise<void> {
	await (await deviceDb()).delete('meta', 'pendingSignOut');
}
