/**
 * A check's recordings as UFF dataset 58: every channel of every file the check was measured
 * with (the bump tests and their backgrounds), one time record each, for modal software and
 * other analysis tools.
 */
import { eq } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { assets, recordings } from '../db/schema.ts';
import { readStored } from '../recordings.ts';
import { formatOf, parseRecordingBytes } from '../../recordings/parse.ts';
import { responseKindOf } from '../../recordings/analyze.ts';
import {
	frfOf,
	readUff,
	recordingFromUff,
	writeUff58,
	type UffFrf,
	type UffTimeRecord
} from '../../recordings/uff.ts';

/** The UFF data type of a channel unit: acceleration 12, velocity 11, displacement 8, force 13. */
function dataTypeOf(unit: string): number {
	if (/^(n|kn|lbf)$/i.test(unit.trim())) return 13;
	if (!unit.trim()) return 0;
	const kind = responseKindOf(unit);
	return kind === 'velocity' ? 11 : kind === 'displacement' ? 8 : 12;
}

export function checkUff(checkId: string): { text: string; tag: string; files: number } | null {
	const rows = db
		.select({
			fileName: recordings.fileName,
			mediaType: recordings.mediaType,
			sha256: recordings.sha256,
			sampleRateHz: recordings.sampleRateHz,
			createdAt: recordings.createdAt,
			tag: assets.tag
		})
		.from(recordings)
		.innerJoin(assets, eq(assets.id, recordings.assetId))
		.where(eq(recordings.checkId, checkId))
		.all();
	if (rows.length === 0) return null;
	const records: UffTimeRecord[] = [];
	const frfs: UffFrf[] = [];
	for (const r of rows) {
		const bytes = new Uint8Array(readStored(r.sha256));
		// a file of FRFs goes out as those FRFs, not as the impulse responses it was analysed as
		const datasets = formatOf(r.fileName, r.mediaType) === 'uff' ? readUff(bytes) : [];
		const frfsHere = datasets.some((d) => d.functionType === 1)
			? []
			: datasets.filter((x) => x.functionType === 4 && x.im && x.even);
		for (const d of frfsHere)
			frfs.push(
				frfOf(d, `${r.tag} ${r.fileName} ${d.idLines[0] ?? ''}`.trim(), new Date(r.createdAt))
			);
		if (frfsHere.length) continue;
		// a UFF file read once: its datasets above are the recording's too
		const rec = datasets.length
			? recordingFromUff(datasets, r.fileName, bytes.length)
			: parseRecordingBytes(bytes, r.fileName, r.mediaType, r.sampleRateHz);
		rec.channels.forEach((c, i) =>
			records.push({
				name: `${r.tag} ${r.fileName} ${c.name}`.slice(0, 80),
				unit: c.unit,
				dataType: dataTypeOf(c.unit),
				sampleRateHz: rec.sampleRateHz,
				samples: c.samples,
				node: 1,
				direction: i + 1,
				at: new Date(r.createdAt)
			})
		);
	}
	return {
		text: writeUff58(records, `Detune check ${checkId}`, frfs),
		tag: rows[0].tag,
		files: rows.length
	};
}
