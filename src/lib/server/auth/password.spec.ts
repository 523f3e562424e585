import { describe, expect, it } from 'vitest';
import { hashPassword, verifyPassword } from './password.ts';

describe('password hashing (argon2id)', () => {
	it('round-trips: the right password verifies, a wrong one does not', async () => {
		const h = await hashPassword('correct horse battery');
		expect(h.startsWith('$argon2id$')).toBe(true);
		expect(h).toContain('m=19456,t=2,p=1'); // OWASP Password Storage Cheat Sheet parameters
		expect(await verifyPassword(h, 'correct horse battery')).toBe(true);
		expect(await verifyPassword(h, 'correct horse batterY')).toBe(false);
	});

	it('salts each hash, and a malformed hash never verifies', async () => {
		expect(await hashPassword('same-password')).not.toBe(await hashPassword('same-password'));
		expect(await verifyPassword('not-a-hash', 'anything')).toBe(false);
	});
});
