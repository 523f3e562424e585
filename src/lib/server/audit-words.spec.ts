import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from './test-db.ts';
import { db } from './db/index.ts';
import { assets, excitationSources, ruleSets, users } from './db/schema.ts';
import * as audit from './db/audit.ts';
import * as edits from './db/asset-edits.ts';
import { inWords } from './audit-words.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

describe('the audit log in words', () => {
	it('names the asset, the user, the form’s labels and the values in words, never ids or code', () => {
		const a = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-102')).get()!;
		const sup = db.select().from(users).where(eq(users.role, 'supervisor')).get()!;
		const other = db
			.select()
			.from(ruleSets)
			.all()
			.find((r) => r.id !== a.ruleSetId)!;
		edits.updateAsset(
			a.id,
			{
				name: a.name,
				machineKind: a.machineKind,
				driveType: a.driveType,
				minRpm: a.minRpm,
				maxRpm: 1200,
				nominalRpm: a.nominalRpm,
				motorPoles: a.motorPoles,
				slipPct: a.slipPct,
				driveRatio: a.driveRatio,
				skipBands: a.skipBands,
				ruleSetId: other.id,
				notes: a.notes
			},
			sup.id
		);
		const vane = db
			.select()
			.from(excitationSources)
			.where(eq(excitationSources.assetId, a.id))
			.all()
			.find((s) => s.kind === 'vane')!;
		edits.updateSource(a.id, vane.id, vane.label, { count: 7 }, sup.id);
		const lines = inWords(audit.search({ assetId: a.id }, 10));
		const asset = lines.find((l) => l.changes.some((c) => c.field === 'Rule set'))!;
		expect(asset.who).toBe(sup.name);
		expect(asset.subject).toBe(`KRW-RWP-102 · ${a.name}`);
		expect(asset.changes).toContainEqual({
			field: 'Maximum speed (rpm)',
			before: String(a.maxRpm),
			after: '1200'
		});
		expect(asset.changes.find((c) => c.field === 'Rule set')?.after).toBe(other.name);
		const source = lines.find((l) => l.subject.endsWith('(an excitation source)'))!;
		expect(source.changes).toContainEqual({ field: 'Values', before: '5 vanes', after: '7 vanes' });
		const all = JSON.stringify(lines.map(({ assetId: _id, ...l }) => l));
		expect(all).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-/);
		expect(all).not.toContain('{\\"');
		expect(all).not.toMatch(/"field":"[a-z]+[A-Z]/);
	});
});
