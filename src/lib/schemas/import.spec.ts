import { describe, expect, it } from 'vitest';
import { MAX_ASSET_LIST_BYTES, parseAssetListUpload } from './import.ts';

const form = (fields: Record<string, string | File>) => {
	const f = new FormData();
	for (const [k, v] of Object.entries(fields)) f.set(k, v);
	return f;
};

describe('the asset-list upload', () => {
	it('takes a file, or the kept text when the file input is empty', () => {
		const file = new File(['tag,name\n'], 'assets.csv', { type: 'text/csv' });
		expect(parseAssetListUpload(form({ file })).data?.file?.name).toBe('assets.csv');
		const kept = parseAssetListUpload(form({ file: new File([], ''), text: 'tag,name\n' }));
		expect(kept.data).toEqual({ file: undefined, text: 'tag,name\n' });
	});

	it('refuses a file over 2 MB with its size, and a file field that is not a file', () => {
		const big = new File([new Uint8Array(MAX_ASSET_LIST_BYTES + 1)], 'big.csv');
		expect(parseAssetListUpload(form({ file: big })).error?.issues[0].message).toMatch(
			/The file is 2\.0 MB; an asset list may be at most 2 MB/
		);
		expect(parseAssetListUpload(form({ file: 'not a file' })).error?.issues[0].message).toMatch(
			/as a file/
		);
	});
});
