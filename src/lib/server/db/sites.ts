/**
 * Sites and areas (admin). Both are synced to the tablets (a version per change); a new recheck
 * interval moves the stale date of every board row of the site in the same transaction.
 */
import { and, asc, eq, ne, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { areas, assets, assetStatus, sites } from './schema.ts';
import { nextVersion } from './versions.ts';
import * as audit from './audit.ts';
import type { SiteForm } from '../../schemas/site.ts';
import type { Tx } from './client.ts';

const DAY = 86_400_000;

export class SiteError extends Error {
	constructor(
		message: string,
		readonly field: string,
		readonly status: 400 | 404 | 409
	) {
		super(message);
		this.name = 'SiteError';
	}
}

export function list() {
	const counts = new Map(
		db
			.select({ siteId: assets.siteId, n: sql<number>`count(*)` })
			.from(assets)
			.groupBy(assets.siteId)
			.all()
			.map((r) => [r.siteId, r.n])
	);
	const allAreas = db
		.select({ id: areas.id, siteId: areas.siteId, name: areas.name })
		.from(areas)
		.orderBy(asc(areas.name))
		.all();
	return db
		.select({ id: sites.id, code: sites.code, name: sites.name, recheckDays: sites.recheckDays })
		.from(sites)
		.orderBy(asc(sites.name))
		.all()
		.map((s) => ({
			...s,
			assets: counts.get(s.id) ?? 0,
			areas: allAreas.filter((a) => a.siteId === s.id)
		}));
}

export function createSite(form: SiteForm, actorId: string, now = Date.now()): string {
	const id = crypto.randomUUID();
	db.transaction((tx) => {
		if (tx.select({ id: sites.id }).from(sites).where(eq(sites.code, form.code)).get())
			throw new SiteError(`Code: ${form.code} is taken by another site.`, 'code', 409);
		tx.insert(sites)
			.values({
				id,
				code: form.code,
				name: form.name,
				recheckDays: form.recheckDays,
				version: nextVersion(tx),
				createdAt: now,
				updatedAt: now
			})
			.run();
		audit.by(tx, actorId, now)('site', id, 'create', { after: form });
	});
	return id;
}

/** Renames a site or changes its recheck interval; answers how many board rows changed their stale date. */
export function updateSite(
	id: string,
	form: Omit<SiteForm, 'code'>,
	actorId: string,
	now = Date.now()
): { changed: boolean; restaled: number } {
	return db.transaction((tx) => {
		const before = tx.select().from(sites).where(eq(sites.id, id)).get();
		if (!before)
			throw new SiteError('That site does not exist (any more): reload the page.', 'form', 404);
		if (before.name === form.name && before.recheckDays === form.recheckDays)
			return { changed: false, restaled: 0 };
		tx.update(sites)
			.set({
				name: form.name,
				recheckDays: form.recheckDays,
				version: nextVersion(tx),
				updatedAt: now
			})
			.where(eq(sites.id, id))
			.run();
		if (before.name !== form.name)
			tx.update(assetStatus)
				.set({ siteName: form.name, updatedAt: now })
				.where(eq(assetStatus.siteId, id))
				.run();
		let restaled = 0;
		if (before.recheckDays !== form.recheckDays) {
			restaled = tx
				.update(assetStatus)
				.set({
					staleAfter: sql`${assetStatus.checkedAt} + ${form.recheckDays * DAY}`,
					updatedAt: now
				})
				.where(and(eq(assetStatus.siteId, id), sql`${assetStatus.checkedAt} is not null`))
				.run().changes;
		}
		audit.by(tx, actorId, now)('site', id, 'update', {
			before: { name: before.name, recheckDays: before.recheckDays },
			after: { name: form.name, recheckDays: form.recheckDays }
		});
		return { changed: true, restaled };
	});
}

function nameTaken(tx: Tx, siteId: string, name: string, exceptId: string | null): boolean {
	const rows = tx
		.select({ id: areas.id })
		.from(areas)
		.where(
			and(
				eq(areas.siteId, siteId),
				sql`lower(${areas.name}) = lower(${name})`,
				exceptId ? ne(areas.id, exceptId) : undefined
			)
		)
		.all();
	return rows.length > 0;
}

export function createArea(
	siteId: string,
	name: string,
	actorId: string,
	now = Date.now()
): string {
	const id = crypto.randomUUID();
	db.transaction((tx) => {
		if (!tx.select({ id: sites.id }).from(sites).where(eq(sites.id, siteId)).get())
			throw new SiteError('That site does not exist (any more): reload the page.', 'form', 404);
		if (nameTaken(tx, siteId, name, null))
			throw new SiteError(`Area: this site already has an area called ${name}.`, 'name', 409);
		tx.insert(areas)
			.values({ id, siteId, name, version: nextVersion(tx), createdAt: now, updatedAt: now })
			.run();
		audit.by(tx, actorId, now)('site', siteId, 'add area', { after: { area: id, name } });
	});
	return id;
}

export function renameArea(id: string, name: string, actorId: string, now = Date.now()): boolean {
	return db.transaction((tx) => {
		const before = tx.select().from(areas).where(eq(areas.id, id)).get();
		if (!before)
			throw new SiteError('That area does not exist (any more): reload the page.', 'form', 404);
		if (before.name === name) return false;
		if (nameTaken(tx, before.siteId, name, id))
			throw new SiteError(`Area: this site already has an area called ${name}.`, 'name', 409);
		tx.update(areas)
			.set({ name, version: nextVersion(tx), updatedAt: now })
			.where(eq(areas.id, id))
			.run();
		audit.by(tx, actorId, now)('site', before.siteId, 'rename area', {
			before: { area: id, name: before.name },
			after: { area: id, name }
		});
		return true;
	});
}
