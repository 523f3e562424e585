/**
 * A small local certificate authority for a plant network, with node-forge: when a plant has no
 * certificate of its own, Detune makes a CA (kept in the TLS folder, valid 10 years) and a server
 * certificate signed by it for the host names and addresses tablets use (valid 2 years, renewed
 * when the names change or it nears its end). Tablets trust the CA once; see /setup/certificate.
 */
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { isIP } from 'node:net';
import { join } from 'node:path';
import forge from 'node-forge';

const { pki, md } = forge;
const DAY = 86_400_000;

/**
 * @param {string} file
 * @param {string} text
 * @param {number} mode
 */
function write(file, text, mode) {
	writeFileSync(file, text, { mode });
	chmodSync(file, mode);
}

/** @param {number} years */
function validity(years) {
	const notBefore = new Date(Date.now() - DAY);
	const notAfter = new Date(notBefore.getTime() + years * 365 * DAY);
	return { notBefore, notAfter };
}

const serial = () => '01' + forge.util.bytesToHex(forge.random.getBytesSync(15));

/** @param {string} dir */
function loadOrMakeCa(dir) {
	const certFile = join(dir, 'ca.crt');
	const keyFile = join(dir, 'ca.key');
	if (existsSync(certFile) && existsSync(keyFile))
		return {
			cert: pki.certificateFromPem(readFileSync(certFile, 'utf8')),
			key: pki.privateKeyFromPem(readFileSync(keyFile, 'utf8')),
			made: false
		};
	const keys = pki.rsa.generateKeyPair(2048);
	const cert = pki.createCertificate();
	cert.publicKey = keys.publicKey;
	cert.serialNumber = serial();
	Object.assign(cert.validity, validity(10));
	const subject = [
		{ name: 'commonName', value: 'Detune local CA' },
		{ name: 'organizationName', value: 'Detune on this plant network' }
	];
	cert.setSubject(subject);
	cert.setIssuer(subject);
	cert.setExtensions([
		{ name: 'basicConstraints', cA: true, pathLenConstraint: 0, critical: true },
		{ name: 'keyUsage', keyCertSign: true, cRLSign: true, critical: true },
		{ name: 'subjectKeyIdentifier' }
	]);
	cert.sign(keys.privateKey, md.sha256.create());
	write(certFile, pki.certificateToPem(cert), 0o644);
	write(keyFile, pki.privateKeyToPem(keys.privateKey), 0o600);
	return { cert, key: keys.privateKey, made: true };
}

/**
 * @param {import('node-forge').pki.Certificate} cert
 * @param {string[]} names
 */
function covers(cert, names) {
	const ext = /** @type {{ altNames?: { value?: string, ip?: string }[] } | undefined} */ (
		cert.getExtension('subjectAltName')
	);
	const have = new Set((ext?.altNames ?? []).map((a) => a.ip ?? a.value));
	const fresh = cert.validity.notAfter.getTime() - Date.now() > 30 * DAY;
	return fresh && names.every((n) => have.has(n));
}

/**
 * The CA and a server certificate for `names` in `dir`, made when missing or out of date.
 * @param {string} dir
 * @param {string[]} names host names and IP addresses
 * @returns {{ cert: string, key: string, caFile: string, made: string[] }}
 */
export function localCertificates(dir, names) {
	mkdirSync(dir, { recursive: true, mode: 0o700 });
	chmodSync(dir, 0o700);
	const ca = loadOrMakeCa(dir);
	const certFile = join(dir, 'server.crt');
	const keyFile = join(dir, 'server.key');
	/** @type {string[]} */
	const made = ca.made ? ['CA'] : [];
	const current = existsSync(certFile)
		? pki.certificateFromPem(readFileSync(certFile, 'utf8'))
		: null;
	if (ca.made || !current || !existsSync(keyFile) || !covers(current, names)) {
		const keys = pki.rsa.generateKeyPair(2048);
		const cert = pki.createCertificate();
		cert.publicKey = keys.publicKey;
		cert.serialNumber = serial();
		Object.assign(cert.validity, validity(2));
		cert.setSubject([{ name: 'commonName', value: names[0] }]);
		cert.setIssuer(ca.cert.subject.attributes);
		cert.setExtensions([
			{ name: 'basicConstraints', cA: false },
			{ name: 'keyUsage', digitalSignature: true, keyEncipherment: true, critical: true },
			{ name: 'extKeyUsage', serverAuth: true },
			{
				name: 'subjectAltName',
				altNames: names.map((n) => (isIP(n) ? { type: 7, ip: n } : { type: 2, value: n }))
			}
		]);
		cert.sign(ca.key, md.sha256.create());
		write(certFile, pki.certificateToPem(cert) + pki.certificateToPem(ca.cert), 0o644);
		write(keyFile, pki.privateKeyToPem(keys.privateKey), 0o600);
		made.push('server certificate');
	}
	return {
		cert: readFileSync(certFile, 'utf8'),
		key: readFileSync(keyFile, 'utf8'),
		caFile: join(dir, 'ca.crt'),
		made
	};
}
