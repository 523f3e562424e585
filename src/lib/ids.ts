import { z } from 'zod';

const uuid = z.uuid();

/** Ids are UUID-shaped (made by the server, or by the tablet for checks and recordings). */
export const isUuid = (s: string): boolean => uuid.safeParse(s).success;

/**
 * A random (version 4) UUID. `crypto.randomUUID` exists only in secure contexts; a tablet that
 * reaches the server over plain HTTP still has `crypto.getRandomValues`, so ids come from that.
 */
export function newId(): string {
	const b = crypto.getRandomValues(new Uint8Array(16));
	b[6] = (b[6] & 0x0f) | 0x40;
	b[8] = (b[8] & 0x3f) | 0x80;
	const h = Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
	return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}
