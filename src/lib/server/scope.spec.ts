/**
 * Cross-site paths: a technician of one site must learn nothing of another site's checks,
 * recordings or follow-ups, through any door that takes an id.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from './test-db.ts';
import { db } from './db/index.ts';
import { checks, users } from './db/schema.ts';
import { demoId } from './db/seed.ts';
import { push } from './sync/push.ts';
import { ingest, RecordingIdTaken, UnknownBackground } from './recordings.ts';
import * as followUps from './db/follow-ups.ts';
import { readableAsset, readableCheck, readableRecording } from './scope.ts';
import { checkItem } from '../../../tests/support/check-item.ts';

function buildCheckItem(o: {
	id?: string;
	assetId: string;
	measuredRpm?: number;
	replacesCheckId?: string;
}) {
	const item = checkItem(o.assetId, o.measuredRpm ?? 1100, { id: o.id });
	return {
		...item,
		replacesCheckId: o.replacesCheckId ?? null,
		modes: item.modes as {
			frequencyHz: number;
			dampingRatio: number | null;
			direction: string;
			location: null;
			origin: string;
			recordingId?: string;
		}[]
	};
}

type U = { id: string; role: 'technician' | 'planner'; name: string };
let kettle: U;
let larkspur: U;
let planner: U;
const kettleAsset = () => demoId('asset:KRW-RWP-103');
const larkspurAsset = () => demoId('asset:LBM-IDF-110');

const userBy = (email: string) => {
	const u = db.select().from(users).where(eq(users.email, email)).get()!;
	return { id: u.id, role: u.role, name: u.name } as U;
};

/** A ring-down as CSV (time, acceleration): 24 Hz, ζ = 0.03, 1 kHz for 2 s. */
function ringdownCsv(): Buffer {
	const rows = ['time_s,accel_g'];
	for (let i = 0; i < 2000; i++) {
		const t = i / 1000;
		rows.push(
			`${t},${(Math.exp(-0.03 * 2 * Math.PI * 24 * t) * Math.sin(2 * Math.PI * 24 * t)).toFixed(6)}`
		);
	}
	return Buffer.from(rows.join('\n'));
}

beforeAll(async () => {
	await freshDatabase({ demo: true });
	kettle = userBy('tech@example.com');
	larkspur = userBy('tech2@example.com');
	planner = userBy('planner@example.com');
});

describe('one scope check for every id', () => {
	it('reads rows of the user’s sites only', () => {
		expect(readableAsset(kettle, kettleAsset())).not.toBeNull();
		expect(readableAsset(kettle, larkspurAsset())).toBeNull();
		expect(readableAsset(planner, larkspurAsset())).not.toBeNull();
	});

	it('push: another site’s check id is not acknowledged as a duplicate', () => {
		const theirs = buildCheckItem({ assetId: larkspurAsset(), measuredRpm: 900 });
		expect(push(larkspur, [theirs]).response.results[0].status).toBe('applied');
		const probe = buildCheckItem({ id: theirs.id, assetId: kettleAsset() });
		const r = push(kettle, [probe]).response.results[0];
		expect(r.status).toBe('rejected');
		expect(r.reason).not.toMatch(/duplicate/i);
		expect(readableCheck(kettle, theirs.id)).toBeNull();
		// the owner's own retry still reads duplicate
		expect(push(larkspur, [theirs]).response.results[0].status).toBe('duplicate');
	});

	it('push: a replaced check or a recording must be of the same asset, on the user’s site', async () => {
		const theirs = db.select().from(checks).where(eq(checks.assetId, larkspurAsset())).get()!;
		const replacing = buildCheckItem({ assetId: kettleAsset(), replacesCheckId: theirs.id });
		const r1 = push(kettle, [replacing]).response.results[0];
		expect(r1.status).toBe('rejected');
		expect(r1.reason).toMatch(/replaces/);

		const rec = crypto.randomUUID();
		await ingest({
			id: rec,
			assetId: larkspurAsset(),
			fileName: 'idf.csv',
			mediaType: 'text/csv',
			bytes: ringdownCsv(),
			sampleRateHz: null
		});
		const item = buildCheckItem({ assetId: kettleAsset() });
		item.modes = [{ ...item.modes[0], origin: 'recording', recordingId: rec }];
		const r2 = push(kettle, [item]).response.results[0];
		expect(r2.status).toBe('rejected');
		expect(r2.reason).toMatch(/Recording/);
		expect(readableRecording(kettle, rec)).toBeNull();
	});

	it('an upload under another asset’s recording id is refused and tells nothing of it', async () => {
		const rec = crypto.randomUUID();
		const first = await ingest({
			id: rec,
			assetId: larkspurAsset(),
			fileName: 'a.csv',
			mediaType: 'text/csv',
			bytes: ringdownCsv(),
			sampleRateHz: null
		});
		expect(first.created).toBe(true);
		await expect(
			ingest({
				id: rec,
				assetId: kettleAsset(),
				fileName: 'b.csv',
				mediaType: 'text/csv',
				bytes: Buffer.from('time_s,a\n0,1\n0.001,0\n'),
				sampleRateHz: null
			})
		).rejects.toThrow(RecordingIdTaken);
	});

	it('a background is stored without modes, and a bump test names only a background of its own asset', async () => {
		const bg = crypto.randomUUID();
		const stored = await ingest({
			id: bg,
			assetId: larkspurAsset(),
			fileName: 'running.csv',
			mediaType: 'text/csv',
			bytes: ringdownCsv(),
			sampleRateHz: null,
			role: 'background'
		});
		expect(stored.analysis).toEqual({ kind: 'background', modes: [] });
		const withIt = await ingest({
			id: crypto.randomUUID(),
			assetId: larkspurAsset(),
			fileName: 'hit.csv',
			mediaType: 'text/csv',
			bytes: ringdownCsv(),
			sampleRateHz: null,
			backgroundId: bg
		});
		// the same record as its own background: every line of it is taken off
		const plain = await ingest({
			id: crypto.randomUUID(),
			assetId: larkspurAsset(),
			fileName: 'hit2.csv',
			mediaType: 'text/csv',
			bytes: ringdownCsv(),
			sampleRateHz: null
		});
		expect(plain.analysis.modes.length).toBeGreaterThan(0);
		expect(withIt.analysis.modes).toEqual([]);
		await expect(
			ingest({
				id: crypto.randomUUID(),
				assetId: kettleAsset(),
				fileName: 'other.csv',
				mediaType: 'text/csv',
				bytes: ringdownCsv(),
				sampleRateHz: null,
				backgroundId: bg
			})
		).rejects.toThrow(UnknownBackground);
	});

	it('follow-ups: a remedy is suggested only from a check of that asset; an assignee must have access', () => {
		const theirs = db.select().from(checks).where(eq(checks.assetId, larkspurAsset())).get()!;
		expect(followUps.suggestRemedy(theirs.id, kettleAsset())).toBeNull();
		expect(followUps.suggestRemedy(theirs.id, larkspurAsset())).not.toBeNull();
		const input = {
			assetId: kettleAsset(),
			checkId: null,
			title: 'Stiffen the motor stool',
			dueDate: null,
			priority: 'normal' as const,
			notes: ''
		};
		expect(() => followUps.create({ ...input, assigneeId: larkspur.id }, planner.id)).toThrow(
			/no access to this asset's site/
		);
		expect(followUps.create({ ...input, assigneeId: kettle.id }, planner.id)).toMatch(/-/);
	});
});
