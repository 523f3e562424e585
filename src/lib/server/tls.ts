/** The local certificate authority that `npm run serve:https` made (scripts/tls.js), if any. */
import { existsSync, readFileSync } from 'node:fs';
import { createHash, X509Certificate } from 'node:crypto';
import { join } from 'node:path';
import { setting } from './config.ts';

export function localCa(): { pem: string; fingerprint: string; validTo: string } | null {
	const file = join(setting('TLS_DIR') ?? 'data/tls', 'ca.crt');
	if (!existsSync(file)) return null;
	const pem = readFileSync(file, 'utf8');
	const x = new X509Certificate(pem);
	const der = x.raw;
	const fingerprint = createHash('sha256')
		.update(der)
		.digest('hex')
		.toUpperCase()
		.replace(/(..)(?!$)/g, '$1:');
	return { pem, fingerprint, validTo: x.validTo };
}
