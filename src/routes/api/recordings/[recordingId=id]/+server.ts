import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { readableRecording } from '$lib/server/scope';
import { readStored } from '$lib/server/recordings';

/** GET: the original file, as a download — never served as something a browser would run. */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const rec = readableRecording(user, event.params.recordingId);
	if (!rec) error(404, { message: 'No such recording.', code: 'not-found' });
	let body: Buffer;
	try {
		body = readStored(rec.sha256);
	} catch {
		error(503, {
			message: `The file ${rec.fileName} is missing from the data folder; restore it from a backup.`,
			code: 'file-missing'
		});
	}
	const safeName = rec.fileName.replace(/[^\w.\- ]/g, '_');
	return new Response(new Uint8Array(body), {
		headers: {
			'content-type': rec.mediaType === 'audio/wav' ? 'audio/wav' : 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${safeName}"`,
			'content-length': String(body.length),
			'x-content-type-options': 'nosniff',
			'cache-control': 'private, no-store'
		}
	});
};
