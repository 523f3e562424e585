import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assets, followUps, mail, users } from './schema.ts';
import * as fu from './follow-ups.ts';
import * as audit from './audit.ts';
import { push } from '../sync/push.ts';
import { runReminders } from '../mail/reminders.ts';
import { startCatcher } from '../mail/index.ts';

let planner: string;
let tech: { id: string; role: 'technician'; name: string };
let assetId: string;

beforeAll(async () => {
	await freshDatabase({ demo: true });
	await startCatcher();
	planner = db.select().from(users).where(eq(users.email, 'planner@example.com')).get()!.id;
	const t = db.select().from(users).where(eq(users.email, 'tech@example.com')).get()!;
	tech = { id: t.id, role: 'technician', name: t.name };
	assetId = db.select().from(assets).where(eq(assets.tag, 'KRW-RWP-101')).get()!.id;
});

const received = async (subject: RegExp, n: number) => {
	for (let i = 0; i < 50; i++) {
		const rows = db
			.select()
			.from(mail)
			.where(eq(mail.status, 'received'))
			.all()
			.filter((m) => subject.test(m.subject));
		if (rows.length >= n) return rows;
		await new Promise((r) => setTimeout(r, 50));
	}
	return db
		.select()
		.from(mail)
		.where(eq(mail.status, 'received'))
		.all()
		.filter((m) => subject.test(m.subject));
};

describe('follow-ups', () => {
	it('suggests the engine’s remedy and closes on a newer clear check only', () => {
		const id = fu.create(
			{
				assetId,
				checkId: null,
				title: 'Stiffen the motor stand',
				assigneeId: tech.id,
				dueDate: '2026-12-20',
				priority: 'high',
				notes: ''
			},
			planner,
			Date.now() - 1000
		);
		const row = fu.byId(id)!;
		expect(row.status).toBe('scheduled');
		expect(row.remedy).toMatchObject({ verdict: expect.any(String) });
		const base = {
			assetId,
			checkedAt: Date.now(),
			measuredRpm: 1000,
			driveSetpointHz: null,
			notes: '',
			replacesCheckId: null,
			device: {
				verdict: 'clear',
				verdictAtSpeed: 'clear',
				worstMarginAtSpeedPct: null,
				worstMarginOverRangePct: null
			}
		};
		// a conflict check leaves it open
		push(tech, [
			{
				...base,
				id: crypto.randomUUID(),
				modes: [
					{
						frequencyHz: 17.2,
						dampingRatio: null,
						direction: null,
						location: null,
						origin: 'typed'
					}
				]
			}
		]);
		expect(fu.byId(id)!.status).toBe('scheduled');
		// a clear one (the mode moved far above every excitation) retests it
		const clear = crypto.randomUUID();
		const r = push(tech, [
			{
				...base,
				id: clear,
				modes: [
					{ frequencyHz: 300, dampingRatio: null, direction: null, location: null, origin: 'typed' }
				]
			}
		]);
		expect(r.response.results[0]).toMatchObject({ status: 'applied', verdict: 'clear' });
		expect(fu.byId(id)!).toMatchObject({ status: 'retested', retestCheckId: clear });
		expect(() => fu.move(id, 'open', planner)).toThrow(/closed by a clear retest/);
	});

	it('is closed by a retest only when it measured every point of the flagged check, and says what was missed', () => {
		// the flagged check: two modes, horizontal at the motor top and vertical at the pump foot
		const base = {
			assetId,
			measuredRpm: 1000,
			driveSetpointHz: null,
			notes: '',
			replacesCheckId: null,
			device: {
				verdict: 'conflict',
				verdictAtSpeed: 'conflict',
				worstMarginAtSpeedPct: null,
				worstMarginOverRangePct: null
			}
		};
		const flagged = crypto.randomUUID();
		push(tech, [
			{
				...base,
				id: flagged,
				checkedAt: Date.now() - 5000,
				modes: [
					{
						frequencyHz: 17.2,
						dampingRatio: null,
						direction: 'horizontal',
						location: 'Motor top',
						origin: 'typed'
					},
					{
						frequencyHz: 33.5,
						dampingRatio: null,
						direction: 'vertical',
						location: 'Pump foot',
						origin: 'typed'
					}
				]
			}
		]);
		const id = fu.create(
			{
				assetId,
				checkId: flagged,
				title: 'Brace the stand',
				assigneeId: tech.id,
				dueDate: '2027-01-20',
				priority: 'high',
				notes: ''
			},
			planner,
			Date.now() - 4000
		);
		const clear = (points: { direction: string; location: string }[], at: number) =>
			push(tech, [
				{
					...base,
					id: crypto.randomUUID(),
					checkedAt: at,
					modes: points.map((p) => ({
						frequencyHz: 300,
						dampingRatio: null,
						...p,
						origin: 'typed'
					}))
				}
			]);
		// before, any clear check closed it, even one that measured only one of the two points
		const partial = clear([{ direction: 'horizontal', location: 'motor top' }], Date.now() - 3000);
		expect(partial.closedFollowUps).not.toContain(id);
		const row = fu.byId(id)!;
		expect(row.status).toBe('scheduled');
		expect(row.notes).toMatch(/did not measure vertical at Pump foot, as the flagged check did/);
		const full = clear(
			[
				{ direction: 'horizontal', location: 'Motor top' },
				{ direction: 'vertical', location: 'Pump foot' }
			],
			Date.now() - 2000
		);
		expect(full.closedFollowUps).toContain(id);
		expect(fu.byId(id)!.status).toBe('retested');
		expect(
			fu.uncoveredPoints(
				[{ direction: 'axial', location: null }],
				[{ direction: 'axial', location: 'x' }]
			)
		).toEqual([]);
	});

	it('sends exactly one overdue mail however often the reminder job runs', async () => {
		const id = fu.create(
			{
				assetId,
				checkId: null,
				title: 'Program the skip band',
				assigneeId: tech.id,
				dueDate: '2026-01-05',
				priority: 'normal',
				notes: ''
			},
			planner
		);
		const first = await runReminders();
		await runReminders();
		await runReminders();
		expect(first.sent).toBeGreaterThanOrEqual(1);
		const sent = db
			.select()
			.from(mail)
			.all()
			.filter((m) => m.dedupeKey === `overdue:${id}:2026-01-05`);
		expect(sent).toHaveLength(1);
		const got = await received(/^Overdue: KRW-RWP-101 — Program the skip band$/, 1);
		expect(got).toHaveLength(1);
		expect(got[0].textBody).toContain('Due: 2026-01-05');
		expect(got[0].toAddress).toBe('tech@example.com');
		expect(db.select().from(followUps).where(eq(followUps.id, id)).get()!.status).toBe('scheduled');
	});

	it('moves to another day on the week calendar, keeping the rest, audited; a done one stays put', () => {
		const id = fu.create(
			{
				assetId,
				checkId: null,
				title: 'Fit the tuned absorber',
				assigneeId: tech.id,
				dueDate: null,
				priority: 'urgent',
				notes: 'Bring the 12 mm shims'
			},
			planner
		);
		fu.reschedule(id, '2027-03-10', planner);
		const after = fu.byId(id)!;
		expect(after).toMatchObject({
			dueDate: '2027-03-10',
			status: 'scheduled',
			assigneeId: tech.id,
			priority: 'urgent',
			notes: 'Bring the 12 mm shims'
		});
		const trail = audit.forEntity('follow_up', id).filter((e) => e.action === 'update');
		expect(trail[0]).toMatchObject({
			userName: 'Dale Okonkwo',
			before: expect.objectContaining({ dueDate: null }),
			after: expect.objectContaining({ dueDate: '2027-03-10' })
		});
		fu.move(id, 'done', planner);
		expect(() => fu.reschedule(id, '2027-03-12', planner)).toThrow(/mark it open again/);
		expect(fu.byId(id)!.dueDate).toBe('2027-03-10');
		expect(() => fu.reschedule('no-such-id', '2027-03-12', planner)).toThrow(/No such/);
	});
});
