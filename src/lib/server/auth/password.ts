/**
 * Password hashing with argon2id (@node-rs/argon2), parameters from the OWASP Password Storage
 * Cheat Sheet (m = 19 MiB, t = 2, p = 1).
 */
import { hash, verify } from '@node-rs/argon2';

const OPTIONS = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

let dummy: Promise<string> | null = null;

/**
 * Spends the same time as a real verification when the account does not exist, so the answer's
 * timing does not tell whether an e-mail address is registered.
 */
export async function burnVerification(password: string): Promise<void> {
	dummy ??= hashPassword('detune-timing-equaliser');
	await verifyPassword(await dummy, password);
}
