import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { readableCheck } from '$lib/server/scope';
import { checkUff } from '$lib/server/reports/uff';

/** GET: the check's recordings as UFF dataset 58 (ASCII), one time record per channel. */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const check = readableCheck(user, event.params.checkId);
	if (!check) error(404, { message: 'No such check.', code: 'not-found' });
	const r = checkUff(check.id);
	if (!r) error(404, { message: 'This check has no recordings to export.', code: 'not-found' });
	return new Response(r.text, {
		headers: {
			'content-type': 'text/plain; charset=us-ascii',
			'content-disposition': `attachment; filename="detune-${r.tag}-check.uff"`,
			'cache-control': 'private, no-store'
		}
	});
};
