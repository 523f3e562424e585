import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { push } from '$lib/server/sync/push';
import { inTurn } from '$lib/server/turns';
import { declaredLength } from '$lib/server/body';
import { MAX_PUSH_BYTES, pushBatch } from '$lib/schemas/sync';
import * as followUps from '$lib/server/db/follow-ups';
import * as users from '$lib/server/db/users';
import { send } from '$lib/server/mail';
import { followUpMail } from '$lib/server/mail/messages';

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
	const { response, failed, closedFollowUps } = await inTurn(() => push(user, batch.data.items));
	// once committed: the planner who raised each closed follow-up and its assignee are told
	for (const id of closedFollowUps) await tellRetested(id);
	return json(response, { status: failed ? 500 : 200, headers: { 'cache-control': 'no-store' } });
};

async function tellRetested(id: string) {
	const f = followUps.byId(id);
	if (!f) return;
	const to = new Set<string>();
	if (f.assigneeEmail) to.add(f.assigneeEmail);
	const creator = f.createdBy ? users.byId(f.createdBy) : undefined;
	if (creator && !creator.disabled) to.add(creator.email);
	for (const address of to)
		await send({
			...followUpMail('retested', f),
			to: address,
			dedupeKey: `retested:${f.id}:${address}`
		});
}
