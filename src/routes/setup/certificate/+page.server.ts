import type { PageServerLoad } from './$types';
import { authorize } from '$lib/server/guard';
import { localCa } from '$lib/server/tls';

/** Public: a tablet needs it before it can trust this server. */
export const load: PageServerLoad = (event) => {
	authorize(event);
	const ca = localCa();
	return { ca: ca ? { fingerprint: ca.fingerprint, validTo: ca.validTo } : null };
};
