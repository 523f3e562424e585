import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assetStatus, checks, users } from './schema.ts';
import { allLimits, updateLimits } from './severity.ts';
import { push } from '../sync/push.ts';
import { pull } from '../sync/pull.ts';
import { demoId } from './seed.ts';
import { checkItem } from '../../../../tests/support/check-item.ts';
import { planningQueue } from './follow-ups.ts';
import { DEFAULT_SEVERITY_LIMITS } from '../../rules/severity-limits.ts';

let tech: { id: string; role: 'technician' };
let supervisor: string;
// KRW-RWP-104: a vertical pump of the demo, group 2, 720–1180 r/min
const assetId = () => demoId('asset:KRW-RWP-104');

beforeAll(async () => {
	await freshDatabase({ demo: true });
	tech = {
		id: db.select().from(users).where(eq(users.email, 'tech@example.com')).get()!.id,
		role: 'technician'
	};
	supervisor = db.select().from(users).where(eq(users.email, 'super@example.com')).get()!.id;
});

const checkWith = (velocity: number | null, modeHz: number) => ({
	...checkItem(assetId(), 1180, { modes: [{ hz: modeHz, zeta: 0.03 }] }),
	overallVelocityMmS: velocity
});

describe('severity on the server', () => {
	it('starts from the shipped limit set, which the migration wrote', () => {
		const rows = allLimits().map(({ updatedAt: _u, ...r }) => r);
		expect(rows).toEqual(
			[...DEFAULT_SEVERITY_LIMITS].sort(
				(a, b) => a.machineGroup.localeCompare(b.machineGroup) || b.support.localeCompare(a.support)
			)
		);
	});

	it('zones a pushed level, keeps how, and puts the zone on the board; the tablet gets the limits', () => {
		// 1180 r/min = 19.7 Hz; a 250 Hz lowest mode (clear of every forcing line) is ≥ 1.25 × that: rigid, group 2 (B/C 2.8, C/D 4.5)
		const c = checkWith(3.9, 250);
		const r = push({ ...tech, name: 'Tomas Ferreira' }, [c]).response.results[0];
		expect(r.status).toBe('applied');
		const row = db.select().from(checks).where(eq(checks.id, c.id)).get()!;
		expect(row).toMatchObject({ overallVelocityMmS: 3.9, severityZone: 'C' });
		expect(row.severity).toMatchObject({ support: 'rigid', band: { lowHz: 10, highHz: 1000 } });
		const status = db.select().from(assetStatus).where(eq(assetStatus.assetId, assetId())).get()!;
		expect(status).toMatchObject({ severityZone: 'C', zoneRank: 1, overallVelocityMmS: 3.9 });
		// clear margins, but zone C: the planner's queue lists it for a follow-up all the same
		expect(r).toMatchObject({ verdict: 'clear' });
		const planner = db.select().from(users).where(eq(users.email, 'planner@example.com')).get()!;
		const queued = planningQueue({ id: planner.id, role: 'planner' }).find(
			(q) => q.assetId === assetId()
		);
		expect(queued).toMatchObject({ verdict: 'clear', severityZone: 'C' });
		const pulled = pull(tech, 0);
		expect(pulled.severityLimits).toHaveLength(4);
		expect(pulled.assets.find((a) => a.id === assetId())!.machineGroup).toBe('group2');
	});

	it('rezones the latest checks when a supervisor edits the limits, audited', () => {
		const n = updateLimits(
			{
				machineGroup: 'group2',
				support: 'rigid',
				abMmS: 1.4,
				bcMmS: 4.0,
				cdMmS: 6.0,
				source: 'Site limits after the 2026 review'
			},
			supervisor
		);
		expect(n).toBeGreaterThan(0);
		const status = db.select().from(assetStatus).where(eq(assetStatus.assetId, assetId())).get()!;
		expect(status.severityZone).toBe('B');
		expect(() =>
			updateLimits(
				{ machineGroup: 'group2', support: 'rigid', abMmS: 3, bcMmS: 2, cdMmS: 6, source: 'x y z' },
				supervisor
			)
		).toThrow(/A\/B < B\/C < C\/D/);
	});

	it('stores a check without a level with no zone, and the board row follows it', () => {
		const c = checkWith(null, 30);
		push({ ...tech, name: 'Tomas Ferreira' }, [c]);
		const status = db.select().from(assetStatus).where(eq(assetStatus.assetId, assetId())).get()!;
		expect(status).toMatchObject({ severityZone: null, zoneRank: 4, overallVelocityMmS: null });
	});
});
