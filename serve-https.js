/**
 * `npm run serve:https`: Detune over HTTPS on the plant network, with no proxy in front. The
 * framework's documented custom server: the built app's handler (build/handler.js) inside a
 * node:https server. Tablets need HTTPS for Floor check: browsers give a plain-HTTP address on the
 * network no service worker (no offline) and no secure-context APIs.
 *
 * - TLS_CERT and TLS_KEY: the plant's own certificate and key (PEM files). Without them a local
 *   certificate authority and a server certificate for ORIGIN's host and TLS_HOSTS are made and
 *   kept in TLS_DIR (default data/tls); tablets install the CA from /setup/certificate.
 * - HTTPS_PORT (default 3443) serves the app; PORT (default 3000) answers plain HTTP with a
 *   redirect to HTTPS, except the certificate page and file, which a tablet needs before it trusts
 *   the CA.
 */
import { createServer as createHttps } from 'node:https';
import { createServer as createHttp } from 'node:http';
import { readFileSync } from 'node:fs';
import { localCertificates } from './scripts/tls.js';

const httpsPort = Number(process.env.HTTPS_PORT ?? 3443);
const httpPort = Number(process.env.PORT ?? 3000);
const host = process.env.HOST ?? '0.0.0.0';
process.env.ORIGIN ??= `https://localhost:${httpsPort}`;
process.env.BODY_SIZE_LIMIT ??= '52M';
process.env.TLS_DIR ??= 'data/tls';
const origin = new URL(process.env.ORIGIN);
if (origin.protocol !== 'https:') {
	console.error(`[detune] ORIGIN must be an https:// address for serve-https (it is ${origin}).`);
	process.exit(1);
}

/** @returns {{ cert: string, key: string }} */
function certificates() {
	const { TLS_CERT, TLS_KEY } = process.env;
	if (TLS_CERT || TLS_KEY) {
		if (!TLS_CERT || !TLS_KEY) {
			console.error('[detune] set both TLS_CERT and TLS_KEY, or neither (for a local CA).');
			process.exit(1);
		}
		console.log(`[detune] TLS: the certificate in ${TLS_CERT}`);
		return { cert: readFileSync(TLS_CERT, 'utf8'), key: readFileSync(TLS_KEY, 'utf8') };
	}
	const names = [
		origin.hostname,
		...(process.env.TLS_HOSTS ?? '')
			.split(',')
			.map((s) => s.trim())
			.filter(Boolean),
		'localhost',
		'127.0.0.1'
	].filter((n, i, all) => all.indexOf(n) === i);
	const local = localCertificates(process.env.TLS_DIR ?? 'data/tls', names);
	console.log(
		`[detune] TLS: local CA in ${process.env.TLS_DIR}${local.made.length ? ` (made: ${local.made.join(', ')})` : ''}; certificate for ${names.join(', ')}; tablets install the CA from ${origin.origin}/setup/certificate`
	);
	return local;
}

const tls = certificates();
const { handler } = await import('./build/handler.js');

const secure = createHttps({ cert: tls.cert, key: tls.key }, handler).listen(httpsPort, host, () =>
	console.log(`[detune] Listening on ${origin.origin} (HTTPS, port ${httpsPort})`)
);

const plain = createHttp((req, res) => {
	if ((req.url ?? '/').startsWith('/setup/certificate')) return handler(req, res);
	res.writeHead(308, { location: `${origin.origin}${req.url ?? '/'}` });
	res.end();
}).listen(httpPort, host, () =>
	console.log(`[detune] plain HTTP on port ${httpPort} redirects to ${origin.origin}`)
);

// as adapter-node's own entry does: stop taking requests, let the app's jobs end, then exit
for (const signal of /** @type {const} */ (['SIGTERM', 'SIGINT']))
	process.once(signal, () => {
		plain.close();
		secure.close(() => process.exit(0));
		secure.closeIdleConnections();
		// @ts-expect-error: the framework's shutdown event for the app's hooks
		process.emit('sveltekit:shutdown', signal);
		setTimeout(() => process.exit(0), 5000).unref();
	});
