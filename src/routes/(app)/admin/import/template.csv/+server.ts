import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { TEMPLATE } from '$lib/server/db/import';

export const GET: RequestHandler = (event) => {
	requireUser(event);
	return new Response(TEMPLATE + '\r\n', {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="detune-asset-import-template.csv"'
		}
	});
};
