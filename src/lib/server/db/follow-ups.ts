/**
 * Follow-ups: the planner's work from a flagged check to a clear retest. Status moves
 * open → scheduled → done by hand; "retested" only when a newer check of the asset comes in clear
 * (set in the same transaction as that check, see sync/push.ts).
 */
import { and, asc, desc, eq, inArray, lt, or, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { assetStatus, assets, checks, followUps, modes, sites, users } from './schema.ts';
import { visibleSiteIds } from './assets.ts';
import type { Role } from '../../roles.ts';
import { refreshAsset } from './status.ts';
import * as audit from './audit.ts';
import type { FollowUpCreate, FollowUpListQuery, FollowUpUpdate } from '../../schemas/follow-up.ts';
import type { Tx } from './client.ts';
import { readableAsset } from '../scope.ts';

/** A refused follow-up write, with its HTTP status: 400 bad choice, 404 gone, 409 closed. */
export class FollowUpError extends Error {
	constructor(
		message: string,
		readonly status: 400 | 404 | 409 = 400
	) {
		super(message);
	}
}

const columns = {
	id: followUps.id,
	assetId: followUps.assetId,
	checkId: followUps.checkId,
	title: followUps.title,
	status: followUps.status,
	priority: followUps.priority,
	dueDate: followUps.dueDate,
	notes: followUps.notes,
	remedy: followUps.remedy,
	assigneeId: followUps.assigneeId,
	retestCheckId: followUps.retestCheckId,
	createdBy: followUps.createdBy,
	createdAt: followUps.createdAt,
	updatedAt: followUps.updatedAt,
	tag: assets.tag,
	assetName: assets.name,
	siteId: assets.siteId,
	site: sites.name,
	assigneeName: users.name,
	assigneeEmail: users.email
};

function select() {
	return db
		.select(columns)
		.from(followUps)
		.innerJoin(assets, eq(assets.id, followUps.assetId))
		.innerJoin(sites, eq(sites.id, assets.siteId))
		.leftJoin(users, eq(users.id, followUps.assigneeId));
}

export type FollowUpRow = Awaited<ReturnType<ReturnType<typeof select>['all']>>[number];

/** The list as its address filters it; a technician sees only what is assigned to them. */
export function listFor(
	user: { id: string; role: string },
	q: Pick<FollowUpListQuery, 'status' | 'assignee' | 'overdue'>,
	today: string
) {
	return list({
		status: q.status,
		assigneeId: user.role === 'technician' ? user.id : q.assignee,
		overdueOn: q.overdue ? today : undefined
	});
}

export function list(
	filter: {
		status?: (typeof followUps.status.enumValues)[number];
		assigneeId?: string;
		overdueOn?: string;
		assetId?: string;
	} = {}
) {
	const c = [];
	if (filter.status) c.push(eq(followUps.status, filter.status));
	if (filter.assigneeId) c.push(eq(followUps.assigneeId, filter.assigneeId));
	if (filter.assetId) c.push(eq(followUps.assetId, filter.assetId));
	if (filter.overdueOn)
		c.push(
			and(lt(followUps.dueDate, filter.overdueOn), inArray(followUps.status, ['open', 'scheduled']))
		);
	return select()
		.where(c.length ? and(...c) : undefined)
		.orderBy(sql`${followUps.dueDate} is null`, asc(followUps.dueDate), desc(followUps.createdAt))
		.all();
}

export function byId(id: string) {
	return select().where(eq(followUps.id, id)).get();
}

/** The remedy the engine suggests for a check: skip bands in the three drive conventions, stiffness or mass change, speed limits. */
export function suggestRemedy(
	checkId: string | null,
	assetId: string
): Record<string, unknown> | null {
	const check = checkId
		? db.select().from(checks).where(eq(checks.id, checkId)).get()
		: db
				.select()
				.from(checks)
				.where(eq(checks.assetId, assetId))
				.orderBy(desc(checks.checkedAt))
				.limit(1)
				.get();
	if (!check || check.assetId !== assetId) return null;
	const result = check.result as { bands?: unknown; remedies?: unknown; warnings?: unknown } | null;
	return {
		checkId: check.id,
		verdict: check.verdict,
		worstPair: check.worstPair,
		bands: result?.bands ?? [],
		remedies: result?.remedies ?? [],
		warnings: result?.warnings ?? [],
		damping: 'Added damping lowers the resonant peak (amplification ≈ 1/(2ζ)) without moving it.'
	};
}

/**
 * Another due date, everything else kept: the week calendar's move. Only work still to do moves;
 * a done follow-up is reopened first, a retested one is closed for good.
 */
export function reschedule(id: string, dueDate: string, actorId: string, now = Date.now()) {
	const before = byId(id);
	if (!before) throw new FollowUpError('No such follow-up.', 404);
	if (before.status === 'done')
		throw new FollowUpError('This follow-up is done: mark it open again to reschedule it.', 409);
	update(
		{
			id,
			assigneeId: before.assigneeId,
			dueDate,
			priority: before.priority,
			notes: before.notes
		},
		actorId,
		now
	);
	return before;
}

/** An assignee must be an active user who may read the follow-up's asset (its site). */
function checkAssignee(tx: Tx, assigneeId: string | null, assetId: string): void {
	if (!assigneeId) return;
	const u = tx
		.select({ id: users.id, role: users.role, name: users.name })
		.from(users)
		.where(and(eq(users.id, assigneeId), eq(users.disabled, false)))
		.get();
	if (!u) throw new FollowUpError('Choose an active user to assign.');
	if (!readableAsset(u, assetId, tx))
		throw new FollowUpError(
			`${u.name} has no access to this asset's site; choose someone who has.`
		);
}

export function create(
	input: Omit<FollowUpCreate, 'backdated'>,
	actorId: string,
	now = Date.now()
): string {
	const id = crypto.randomUUID();
	const remedy = suggestRemedy(input.checkId, input.assetId);
	db.transaction((tx) => {
		if (!tx.select({ id: assets.id }).from(assets).where(eq(assets.id, input.assetId)).get())
			throw new FollowUpError('No such asset.', 404);
		if (
			input.checkId &&
			!tx
				.select({ id: checks.id })
				.from(checks)
				.where(and(eq(checks.id, input.checkId), eq(checks.assetId, input.assetId)))
				.get()
		)
			throw new FollowUpError('That check is not of this asset.');
		checkAssignee(tx, input.assigneeId, input.assetId);
		tx.insert(followUps)
			.values({
				id,
				assetId: input.assetId,
				checkId: input.checkId,
				createdBy: actorId,
				assigneeId: input.assigneeId,
				title: input.title,
				remedy,
				status: input.dueDate ? 'scheduled' : 'open',
				priority: input.priority,
				dueDate: input.dueDate,
				notes: input.notes,
				createdAt: now,
				updatedAt: now
			})
			.run();
		audit.by(tx, actorId, now)('follow_up', id, 'create', { after: { ...input } });
		refreshAsset(tx, input.assetId, now);
	});
	return id;
}

export function update(
	input: Omit<FollowUpUpdate, 'backdated'>,
	actorId: string,
	now = Date.now()
): { assigneeChanged: boolean } {
	return db.transaction((tx) => {
		const before = tx.select().from(followUps).where(eq(followUps.id, input.id)).get();
		if (!before) throw new FollowUpError('No such follow-up.', 404);
		if (before.status === 'retested')
			throw new FollowUpError('This follow-up is closed by a clear retest.', 409);
		checkAssignee(tx, input.assigneeId, before.assetId);
		const status = before.status === 'open' && input.dueDate ? 'scheduled' : before.status;
		tx.update(followUps)
			.set({
				assigneeId: input.assigneeId,
				dueDate: input.dueDate,
				priority: input.priority,
				notes: input.notes,
				status,
				updatedAt: now
			})
			.where(eq(followUps.id, input.id))
			.run();
		audit.by(tx, actorId, now)('follow_up', input.id, 'update', {
			before: {
				assigneeId: before.assigneeId,
				dueDate: before.dueDate,
				priority: before.priority,
				status: before.status
			},
			after: {
				assigneeId: input.assigneeId,
				dueDate: input.dueDate,
				priority: input.priority,
				status
			}
		});
		return { assigneeChanged: before.assigneeId !== input.assigneeId && input.assigneeId !== null };
	});
}

export function move(
	id: string,
	status: 'open' | 'scheduled' | 'done',
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const before = tx.select().from(followUps).where(eq(followUps.id, id)).get();
		if (!before) throw new FollowUpError('No such follow-up.', 404);
		if (before.status === 'retested')
			throw new FollowUpError('This follow-up is closed by a clear retest.', 409);
		tx.update(followUps).set({ status, updatedAt: now }).where(eq(followUps.id, id)).run();
		audit.by(tx, actorId, now)('follow_up', id, `status ${before.status} → ${status}`, {
			before: { status: before.status },
			after: { status }
		});
		refreshAsset(tx, before.assetId, now);
	});
}

/** A new clear check closes the asset's follow-ups that were made before it (in the check's transaction). */
/** A measurement point: the direction and location a mode was measured at. */
interface Point {
	direction: string | null;
	location: string | null;
}

const same = (a: string | null, b: string | null) =>
	(a ?? '').trim().toLowerCase() === (b ?? '').trim().toLowerCase();

/**
 * What a retest leaves out of the flagged check: each flagged mode's measurement point (direction
 * and location) that no mode of the retest was measured at. Empty when the retest covers them all.
 */
export function uncoveredPoints(flagged: Point[], retest: Point[]): Point[] {
	const missing: Point[] = [];
	for (const f of flagged) {
		const covered = retest.some(
			(r) =>
				same(r.direction, f.direction) &&
				(!(f.location ?? '').trim() || same(r.location, f.location))
		);
		if (
			!covered &&
			!missing.some((m) => same(m.direction, f.direction) && same(m.location, f.location))
		)
			missing.push(f);
	}
	return missing;
}

const pointText = (p: Point) =>
	`${p.direction ?? 'no direction'}${(p.location ?? '').trim() ? ` at ${p.location!.trim()}` : ''}`;

/**
 * A clear check closes the asset's follow-ups raised before it, as "retested", when it measured
 * every point the flagged check had (a follow-up raised without a check: any clear check). One
 * that misses points stays open, and its notes say what the retest left out. Returns the ids of
 * the follow-ups closed.
 */
export function retestedBy(
	tx: Tx,
	assetId: string,
	checkId: string,
	checkedAt: number,
	retestPoints: Point[],
	now = Date.now()
): string[] {
	const open = tx
		.select({ id: followUps.id, checkId: followUps.checkId, notes: followUps.notes })
		.from(followUps)
		.where(
			and(
				eq(followUps.assetId, assetId),
				inArray(followUps.status, ['open', 'scheduled', 'done']),
				lt(followUps.createdAt, checkedAt)
			)
		)
		.all();
	const closed: string[] = [];
	for (const f of open) {
		const flagged = f.checkId
			? tx
					.select({ direction: modes.direction, location: modes.location })
					.from(modes)
					.where(eq(modes.checkId, f.checkId))
					.all()
			: [];
		const missing = uncoveredPoints(flagged, retestPoints);
		if (missing.length) {
			const note = `A clear check of ${new Date(checkedAt).toISOString().slice(0, 10)} did not close this: it did not measure ${missing.map(pointText).join('; ')}, as the flagged check did.`;
			tx.update(followUps)
				.set({ notes: f.notes ? `${f.notes}\n${note}` : note, updatedAt: now })
				.where(eq(followUps.id, f.id))
				.run();
			audit.by(tx, null, now)('follow_up', f.id, 'retest incomplete', {
				after: { checkId, missing }
			});
			continue;
		}
		tx.update(followUps)
			.set({ status: 'retested', retestCheckId: checkId, updatedAt: now })
			.where(eq(followUps.id, f.id))
			.run();
		audit.by(tx, null, now)('follow_up', f.id, 'retested by a clear check', { after: { checkId } });
		closed.push(f.id);
	}
	return closed;
}

/** Follow-ups with a due date, for the reminder job. */
export function due(beforeOrOn: string) {
	return select()
		.where(
			and(
				inArray(followUps.status, ['open', 'scheduled']),
				sql`${followUps.dueDate} is not null`,
				sql`${followUps.dueDate} <= ${beforeOrOn}`,
				sql`${followUps.assigneeId} is not null`
			)
		)
		.all();
}

/**
 * The planner's queue: assets on the user's sites whose latest check is in conflict or tight, or
 * is overdue for a recheck, and that have no follow-up open; worst first (verdict, then the
 * smallest margin over the range).
 */
export function planningQueue(user: { id: string; role: Role }, now = Date.now(), limit = 50) {
	const scope = visibleSiteIds(user);
	if (scope !== 'all' && scope.length === 0) return [];
	const flagged = or(
		inArray(assetStatus.verdict, ['conflict', 'tight']),
		lt(assetStatus.staleAfter, now),
		// a vibration level in zone C or D wants action whatever the margins say
		inArray(assetStatus.severityZone, ['C', 'D'])
	);
	return db
		.select({
			assetId: assetStatus.assetId,
			tag: assetStatus.tag,
			name: assetStatus.name,
			site: assetStatus.siteName,
			verdict: assetStatus.verdict,
			checkId: assetStatus.latestCheckId,
			checkedAt: assetStatus.checkedAt,
			worstMarginOverRangePct: assetStatus.worstMarginOverRangePct,
			worstPair: assetStatus.worstPair,
			staleAfter: assetStatus.staleAfter,
			severityZone: assetStatus.severityZone,
			overallVelocityMmS: assetStatus.overallVelocityMmS
		})
		.from(assetStatus)
		.where(
			and(
				eq(assetStatus.openFollowUps, 0),
				flagged,
				scope === 'all' ? undefined : inArray(assetStatus.siteId, scope)
			)
		)
		.orderBy(
			desc(assetStatus.verdictRank),
			asc(assetStatus.zoneRank),
			sql`${assetStatus.worstMarginOverRangePct} asc nulls last`,
			asc(assetStatus.tag)
		)
		.limit(limit)
		.all();
}
