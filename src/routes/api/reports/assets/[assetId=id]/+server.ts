import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { readableAsset } from '$lib/server/scope';
import { assetReport } from '$lib/server/reports/pdf';

export const GET: RequestHandler = async (event) => {
	const user = requireUser(event);
	const asset = readableAsset(user, event.params.assetId);
	if (!asset) error(404, { message: 'No such asset.', code: 'not-found' });
	const r = await assetReport(asset.id, user.frequencyUnit);
	if (!r) error(404, { message: 'No such asset.', code: 'not-found' });
	return new Response(new Uint8Array(r.pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `inline; filename="detune-${r.tag}.pdf"`,
			'cache-control': 'private, no-store'
		}
	});
};
