import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { authorize } from '$lib/server/guard';
import { localCa } from '$lib/server/tls';

/** GET /setup/certificate/detune-ca.crt — the local CA's certificate (public, never its key). */
export const GET: RequestHandler = (event) => {
	authorize(event);
	const ca = localCa();
	if (!ca)
		error(404, {
			message: 'This server uses the plant’s own certificate; there is no local CA to install.',
			code: 'no-local-ca'
		});
	return new Response(ca.pem, {
		headers: {
			'content-type': 'application/x-x509-ca-cert',
			'content-disposition': 'attachment; filename="detune-ca.crt"',
			'cache-control': 'no-store'
		}
	});
};
