import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { readableCheck } from '$lib/server/scope';
import { checkReport } from '$lib/server/reports/pdf';

export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const check = readableCheck(user, event.params.checkId);
	if (!check) error(404, { message: 'No such check.', code: 'not-found' });
	const r = await checkReport(check.id, user.frequencyUnit);
	if (!r) error(404, { message: 'No such check.', code: 'not-found' });
	return new Response(new Uint8Array(r.pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="detune-${r.tag}-check.pdf"`,
			'cache-control': 'private, no-store'
		}
	});
};
