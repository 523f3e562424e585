import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { push } from '$lib/server/sync/push';
import { inTurn } from '$lib/server/turns';
import { declaredLength } from '$lib/server/body';
import { MAX_PUSH_BYTES, pushBatch } from '$lib/schemas/sync';

/** POST /api/sync/push — see DEVELOPERS.md, "Sync API". */
export const POST: RequestHandler = async (event) => {
	const user = requireUser(event);
	if (!(event.request.headers.get('content-type') ?? '').startsWith('application/json'))
		error(415, { message: 'Send the batch as application/json.', code: 'bad-content-type' });
	if ((declaredLength(event.request) ?? 0) > MAX_PUSH_BYTES)
		error(413, {
			message: `A push may be at most ${MAX_PUSH_BYTES} bytes; send fewer items per batch.`,
			code: 'too-large'
		});
	const text = await event.request.text();
	if (text.length > MAX_PUSH_BYTES)
		error(413, {
			message: `A push may be at most ${MAX_PUSH_BYTES} bytes; send fewer items per batch.`,
			code: 'too-large'
		});
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		error(400, { message: 'The body is not valid JSON.', code: 'bad-json' });
	}
	const batch = pushBatch.safeParse(body);
	if (!batch.success)
		error(400, {
			message: `Bad batch: ${batch.error.issues[0].path.join('.') || 'body'}: ${batch.error.issues[0].message}`,
			code: 'bad-batch'
		});
	const { response, failed } = await inTurn(() => push(user, batch.data.items));
	return json(response, { status: failed ? 500 : 200, headers: { 'cache-control': 'no-store' } });
};
