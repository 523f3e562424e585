import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as importer from '$lib/server/db/import';
import { inTurn } from '$lib/server/turns';
import { declaredLength } from '$lib/server/body';
import { isZip, sheetToCsv, WorkbookError } from '$lib/server/xlsx';
import { MAX_ASSET_LIST_BYTES, parseAssetListUpload } from '$lib/schemas/import';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	return { columns: importer.IMPORT_COLUMNS.map(([name, meaning]) => ({ name, meaning })) };
};

async function textOf(
	request: Request
): Promise<{ text: string } | { error: string; status?: number }> {
	// refuse from the declared length, before reading a body that cannot be an asset list
	const declared = declaredLength(request);
	if (declared !== null && declared > MAX_ASSET_LIST_BYTES + 64 * 1024)
		return {
			error: `The upload is ${(declared / 1048576).toFixed(1)} MB; an asset list may be at most 2 MB.`,
			status: 413
		};
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		return {
			error: 'Send the asset list as a file from the form (multipart/form-data).',
			status: 415
		};
	}
	const upload = parseAssetListUpload(form);
	if (!upload.success) return { error: upload.error.issues[0].message };
	const { file, text: kept } = upload.data;
	if (file) {
		const bytes = new Uint8Array(await file.arrayBuffer());
		// a workbook (.xlsx) is read into the same CSV text, so the same rules apply to both
		if (/\.xlsx$/i.test(file.name) || isZip(bytes)) {
			try {
				return { text: await sheetToCsv(bytes) };
			} catch (e) {
				if (e instanceof WorkbookError) return { error: e.message };
				throw e;
			}
		}
		return { text: new TextDecoder().decode(bytes) };
	}
	if (kept) return { text: kept };
	return { error: 'Choose a CSV or .xlsx file.' };
}

export const actions: Actions = {
	preview: async (event) => {
		requireRole(event, ['admin']);
		const t = await textOf(event.request);
		if ('error' in t) return fail(t.status ?? 400, { stage: 'preview', error: t.error });
		const v = importer.validate(t.text);
		return {
			stage: 'preview',
			text: t.text,
			total: v.total,
			errors: v.errors,
			rows: v.rows.slice(0, 100).map((r) => ({
				row: r.row,
				tag: r.tag,
				name: r.asset.name,
				minRpm: r.asset.minRpm,
				maxRpm: r.asset.maxRpm,
				sources: r.sources.length
			}))
		};
	},
	import: async (event) => {
		const actor = requireRole(event, ['admin']);
		const t = await textOf(event.request);
		if ('error' in t) return fail(t.status ?? 400, { stage: 'import', error: t.error });
		const r = await inTurn(() => importer.run(t.text, actor.id));
		if (r.errors.length)
			return fail(400, { stage: 'preview', text: t.text, total: 0, errors: r.errors, rows: [] });
		return { stage: 'done', added: r.added, updated: r.updated };
	}
};
