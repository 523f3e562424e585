/** The asset-list import's upload: a CSV or .xlsx file, or the text kept from the preview. */
import { z } from 'zod';

export const MAX_ASSET_LIST_BYTES = 2 * 1024 * 1024;

const mb = (bytes: number) => (bytes / 1048576).toFixed(1);

export const assetListUpload = z.object({
	/** the chosen file; an empty file input posts a file of no bytes, taken as none */
	file: z
		.instanceof(File, { error: 'Send the asset list as a file (the form’s file field).' })
		.optional()
		.transform((f) => (f && f.size > 0 ? f : undefined))
		.refine((f) => !f || f.size <= MAX_ASSET_LIST_BYTES, {
			error: (issue) =>
				`The file is ${mb((issue.input as File).size)} MB; an asset list may be at most 2 MB.`
		}),
	/** the previewed text, sent again with the import */
	text: z
		.string({ error: 'The kept text must be text.' })
		.max(MAX_ASSET_LIST_BYTES, 'The kept text is over 2 MB: choose the file again.')
		.optional()
});

/** The multipart form's two fields parsed (any other field is ignored). */
export const parseAssetListUpload = (form: FormData) =>
	assetListUpload.safeParse({
		file: form.get('file') ?? undefined,
		text: form.get('text') ?? undefined
	});
