/**
 * Bump-test files on the server: each stored once by its SHA-256 under the data folder, its
 * metadata in SQLite, and analysed again here with the same code the tablet ran, so the server's
 * modes are on record beside the device's.
 */
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { eq } from 'drizzle-orm';
import { db } from './db/index.ts';
import { recordings } from './db/schema.ts';
import { setting } from './config.ts';
import { RecordingError } from '../recordings/types.ts';
import { analyseUpload } from './analysis/pool.ts';
import { preflight } from '../recordings/parse.ts';
import type { StoredAnalysis } from './analysis/task.ts';
import type { SweepChoice } from '../recordings/sweep.ts';

export function dataDir(): string {
	return resolve(setting('DATA_DIR') ?? 'data/files');
}

function pathFor(sha256: string): string {
	return join(dataDir(), 'recordings', sha256.slice(0, 2), sha256);
}

export type { StoredAnalysis } from './analysis/task.ts';

export interface IngestInput {
	id: string;
	assetId: string;
	fileName: string;
	mediaType: string;
	bytes: Buffer;
	sampleRateHz: number | null;
	role?: 'background' | 'sweep';
	/** a sweep's channel roles */
	sweep?: SweepChoice | null;
	/** a background recording of the same asset, already stored */
	backgroundId?: string;
}

/** A background that is not a stored background of this asset. */
export class UnknownBackground extends Error {
	constructor() {
		super('The background recording named is not on the server for this asset; send it first.');
	}
}

/** An upload whose id is already a recording of another asset (never a retry of this one). */
export class RecordingIdTaken extends Error {
	constructor() {
		super('This recording id is taken; the tablet makes a new one for a new file.');
	}
}

/**
 * Stores a recording (idempotent on its id), parsed and analysed in the analysis thread first.
 * Returns whether it was new; throws RecordingError for a file that cannot be read.
 */
export async function ingest(input: IngestInput): Promise<{
	created: boolean;
	sha256: string;
	analysis: StoredAnalysis;
}> {
	const existing = db.select().from(recordings).where(eq(recordings.id, input.id)).get();
	// the same id for another asset is not this upload again: say nothing about that recording
	if (existing && existing.assetId !== input.assetId) throw new RecordingIdTaken();
	if (existing)
		return {
			created: false,
			sha256: existing.sha256,
			analysis: existing.analysis as unknown as StoredAnalysis
		};
	// a too-wide CSV or a file of another kind is refused here, before a copy goes to the thread
	preflight(
		new Uint8Array(input.bytes.buffer, input.bytes.byteOffset, input.bytes.byteLength),
		input.fileName,
		input.mediaType
	);
	let background: { bytes: Uint8Array; fileName: string; mediaType: string } | null = null;
	if (input.backgroundId) {
		const bg = db.select().from(recordings).where(eq(recordings.id, input.backgroundId)).get();
		if (!bg || bg.assetId !== input.assetId) throw new UnknownBackground();
		background = { bytes: readStored(bg.sha256), fileName: bg.fileName, mediaType: bg.mediaType };
	}
	const outcome = await analyseUpload({
		bytes: input.bytes,
		fileName: input.fileName,
		mediaType: input.mediaType,
		sampleRateHz: input.sampleRateHz,
		role: input.role,
		sweep: input.sweep ?? null,
		background
	});
	if (!outcome.ok)
		throw new RecordingError(outcome.message, { row: outcome.row, column: outcome.column });
	const { shape, analysis } = outcome;
	const sha256 = createHash('sha256').update(input.bytes).digest('hex');
	const file = pathFor(sha256);
	if (!existsSync(file)) {
		mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
		// write then rename, so a crash never leaves half a file under its hash
		const tmp = `${file}.${process.pid}.tmp`;
		writeFileSync(tmp, input.bytes, { mode: 0o600 });
		renameSync(tmp, file);
	}
	db.insert(recordings)
		.values({
			id: input.id,
			assetId: input.assetId,
			sha256,
			fileName: input.fileName.slice(0, 200),
			sizeBytes: input.bytes.length,
			mediaType: shape.format === 'wav' ? 'audio/wav' : 'text/csv',
			sampleRateHz: shape.sampleRateHz,
			channels: shape.channels,
			durationS: shape.durationS,
			analysis: analysis as unknown as Record<string, unknown>,
			createdAt: Date.now()
		})
		.onConflictDoNothing()
		.run();
	return { created: true, sha256, analysis };
}

export function readStored(sha256: string): Buffer {
	return readFileSync(pathFor(sha256));
}

/** The device's frequencies differ from the server's when a mode is missing or moved by more than 0.5 %. */
export function analysesDiffer(server: StoredAnalysis, deviceHz: number[]): boolean {
	const s = server.modes.map((m) => m.frequencyHz);
	return deviceHz.some((f) => !s.some((g) => Math.abs(g - f) / f <= 0.005));
}
