/**
 * Session ids at rest are SHA-256 hashes (lucia's own guidance): the cookie holds the id, the
 * database only its hash, so a session id read from the database or a backup opens nothing.
 * A thin wrapper around the Drizzle adapter that hashes every id on its way in.
 */
import type { Adapter, DatabaseSession, DatabaseUser } from 'lucia';
import { sha256 } from '@oslojs/crypto/sha2';
import { encodeHexLowerCase } from '@oslojs/encoding';

export const hashSessionId = (id: string): string =>
	encodeHexLowerCase(sha256(new TextEncoder().encode(id)));

export class HashedSessionAdapter implements Adapter {
	constructor(private readonly inner: Adapter) {}

	async getSessionAndUser(
		sessionId: string
	): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
		const [session, user] = await this.inner.getSessionAndUser(hashSessionId(sessionId));
		// lucia goes on with the id it was given (the cookie's), never the stored hash
		return [session ? { ...session, id: sessionId } : null, user];
	}

	getUserSessions(userId: string): Promise<DatabaseSession[]> {
		return this.inner.getUserSessions(userId);
	}

	setSession(session: DatabaseSession): Promise<void> {
		return this.inner.setSession({ ...session, id: hashSessionId(session.id) });
	}

	updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
		return this.inner.updateSessionExpiration(hashSessionId(sessionId), expiresAt);
	}

	deleteSession(sessionId: string): Promise<void> {
		return this.inner.deleteSession(hashSessionId(sessionId));
	}

	deleteUserSessions(userId: string): Promise<void> {
		return this.inner.deleteUserSessions(userId);
	}

	deleteExpiredSessions(): Promise<void> {
		return this.inner.deleteExpiredSessions();
	}
}
