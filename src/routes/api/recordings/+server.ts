import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { readableAsset } from '$lib/server/scope';
import { ingest, RecordingIdTaken, UnknownBackground } from '$lib/server/recordings';
import { AnalysisUnavailable } from '$lib/server/analysis/pool';
import { MAX_RECORDING_BYTES, RecordingError } from '$lib/recordings/types';
import { recordingUploadQuery } from '$lib/schemas/recording';
import { firstProblem } from '$lib/schemas/sync';
import { declaredLength } from '$lib/server/body';

/**
 * POST /api/recordings?id=<uuid>&assetId=…&name=…[&sampleRateHz=…][&role=background|sweep]
 * [&sweep=<roles JSON>] with the file as the body.
 * Idempotent on id. The file is parsed and analysed (in the analysis thread) before anything is
 * stored; with the thread busy and uploads already waiting, 503 with Retry-After.
 */
export const POST: RequestHandler = async (event) => {
	const user = requireUser(event);
	const query = recordingUploadQuery.safeParse(Object.fromEntries(event.url.searchParams));
	if (!query.success) error(400, { message: firstProblem(query.error), code: 'bad-query' });
	const { id, assetId, name, sampleRateHz, role, sweep, background } = query.data;
	const declared = declaredLength(event.request);
	if (declared !== null && declared > MAX_RECORDING_BYTES)
		error(413, {
			message: `Recordings may be at most 50 MB; this one is ${(declared / 1048576).toFixed(1)} MB.`,
			code: 'too-large'
		});
	const type = event.request.headers.get('content-type') ?? '';
	if (!/^(text\/csv|text\/plain|audio\/(x-)?wav|application\/octet-stream)/.test(type))
		error(415, {
			message: 'Send a CSV (text/csv) or WAV (audio/wav) file.',
			code: 'bad-content-type'
		});
	if (!readableAsset(user, assetId))
		error(404, { message: 'No such asset on your sites.', code: 'no-asset' });
	const bytes = Buffer.from(await event.request.arrayBuffer());
	if (bytes.length > MAX_RECORDING_BYTES)
		error(413, { message: 'Recordings may be at most 50 MB.', code: 'too-large' });
	try {
		const r = await ingest({
			id,
			assetId,
			fileName: name,
			mediaType: type,
			bytes,
			sampleRateHz,
			role,
			sweep,
			backgroundId: background
		});
		return json(
			{ id, sha256: r.sha256, created: r.created, modes: r.analysis.modes.length },
			{ status: r.created ? 201 : 200 }
		);
	} catch (e) {
		if (e instanceof RecordingIdTaken) error(409, { message: e.message, code: 'id-taken' });
		if (e instanceof UnknownBackground) error(422, { message: e.message, code: 'no-background' });
		if (e instanceof RecordingError) error(422, { message: e.message, code: 'bad-file' });
		if (e instanceof AnalysisUnavailable) {
			if (!e.retry) error(422, { message: e.message, code: 'too-heavy' });
			return json(
				{ message: e.message, code: 'busy' },
				{ status: 503, headers: { 'retry-after': '30' } }
			);
		}
		throw e;
	}
};
