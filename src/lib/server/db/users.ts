/** Users and their site assignments. */
import { and, asc, eq, inArray, ne, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { sites, userSites, users, type User } from './schema.ts';
import * as audit from './audit.ts';
import type { Role } from '../../roles.ts';
import type { FrequencyUnit } from '../../frequency.ts';
import type { Tx } from './client.ts';

export class LastAdminError extends Error {
	constructor() {
		super('This is the last active admin: make another user admin first.');
		this.name = 'LastAdminError';
	}
}

export class UnknownUserError extends Error {
	constructor() {
		super('That account does not exist (any more): reload the list.');
		this.name = 'UnknownUserError';
	}
}

export class UnknownSiteError extends Error {
	constructor() {
		super('Sites: choose from the list (one of those given does not exist).');
		this.name = 'UnknownSiteError';
	}
}

/** The user with this id, or UnknownUserError. */
function userOf(tx: Tx, id: string): User {
	const u = tx.select().from(users).where(eq(users.id, id)).get();
	if (!u) throw new UnknownUserError();
	return u;
}

function checkSites(tx: Tx, siteIds: string[]): void {
	if (siteIds.length === 0) return;
	const found = tx
		.select({ id: sites.id })
		.from(sites)
		.where(inArray(sites.id, siteIds))
		.all().length;
	if (found !== new Set(siteIds).size) throw new UnknownSiteError();
}

export class DuplicateEmailError extends Error {
	constructor(email: string) {
		super(`${email} already has an account.`);
		this.name = 'DuplicateEmailError';
	}
}

/** A user without the password hash, for pages. */
export type PublicUser = Omit<User, 'passwordHash'> & { siteIds: string[] };

const publicColumns = {
	id: users.id,
	email: users.email,
	name: users.name,
	role: users.role,
	disabled: users.disabled,
	unitSystem: users.unitSystem,
	frequencyUnit: users.frequencyUnit,
	createdAt: users.createdAt,
	updatedAt: users.updatedAt
};

export function byEmail(email: string): User | undefined {
	return db.select().from(users).where(eq(users.email, email.trim().toLowerCase())).get();
}

export function byId(id: string): User | undefined {
	return db.select().from(users).where(eq(users.id, id)).get();
}

export function siteIdsOf(userId: string): string[] {
	return db
		.select({ siteId: userSites.siteId })
		.from(userSites)
		.where(eq(userSites.userId, userId))
		.all()
		.map((r) => r.siteId);
}

export function list(): PublicUser[] {
	const rows = db.select(publicColumns).from(users).orderBy(asc(users.name)).all();
	const links = db.select().from(userSites).all();
	return rows.map((u) => ({
		...u,
		siteIds: links.filter((l) => l.userId === u.id).map((l) => l.siteId)
	}));
}

export function byRole(role: Role) {
	return db
		.select(publicColumns)
		.from(users)
		.where(and(eq(users.role, role), eq(users.disabled, false)))
		.orderBy(asc(users.name))
		.all();
}

function activeAdminsOtherThan(id: string): number {
	const row = db
		.select({ n: sql<number>`count(*)` })
		.from(users)
		.where(and(eq(users.role, 'admin'), eq(users.disabled, false), ne(users.id, id)))
		.get();
	return row?.n ?? 0;
}

export interface NewUser {
	email: string;
	name: string;
	role: Role;
	passwordHash: string;
	siteIds: string[];
}

export function create(input: NewUser, actorId: string | null, now = Date.now()): string {
	const id = crypto.randomUUID();
	const email = input.email.trim().toLowerCase();
	db.transaction((tx) => {
		if (tx.select({ id: users.id }).from(users).where(eq(users.email, email)).get())
			throw new DuplicateEmailError(email);
		checkSites(tx, input.siteIds);
		tx.insert(users)
			.values({
				id,
				email,
				name: input.name,
				role: input.role,
				passwordHash: input.passwordHash,
				createdAt: now,
				updatedAt: now
			})
			.run();
		for (const siteId of input.siteIds) tx.insert(userSites).values({ userId: id, siteId }).run();
		audit.by(tx, actorId, now)('user', id, 'create', {
			after: { email, name: input.name, role: input.role, siteIds: input.siteIds }
		});
	});
	return id;
}

export function update(
	id: string,
	changes: { role?: Role; name?: string; siteIds?: string[] },
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const before = userOf(tx, id);
		if (changes.siteIds) checkSites(tx, changes.siteIds);
		if (
			changes.role &&
			changes.role !== 'admin' &&
			before.role === 'admin' &&
			!before.disabled &&
			activeAdminsOtherThan(id) === 0
		)
			throw new LastAdminError();
		const beforeSites = tx
			.select()
			.from(userSites)
			.where(eq(userSites.userId, id))
			.all()
			.map((r) => r.siteId);
		tx.update(users)
			.set({ role: changes.role ?? before.role, name: changes.name ?? before.name, updatedAt: now })
			.where(eq(users.id, id))
			.run();
		if (changes.siteIds) {
			tx.delete(userSites).where(eq(userSites.userId, id)).run();
			for (const siteId of changes.siteIds)
				tx.insert(userSites).values({ userId: id, siteId }).run();
		}
		audit.by(tx, actorId, now)('user', id, 'update', {
			before: { role: before.role, name: before.name, siteIds: beforeSites },
			after: {
				role: changes.role ?? before.role,
				name: changes.name ?? before.name,
				siteIds: changes.siteIds ?? beforeSites
			}
		});
	});
}

export function setDisabled(
	id: string,
	disabled: boolean,
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const before = userOf(tx, id);
		if (disabled && before.role === 'admin' && !before.disabled && activeAdminsOtherThan(id) === 0)
			throw new LastAdminError();
		tx.update(users).set({ disabled, updatedAt: now }).where(eq(users.id, id)).run();
		audit.by(tx, actorId, now)('user', id, disabled ? 'disable' : 'enable', {
			before: { disabled: before.disabled },
			after: { disabled }
		});
	});
}

/** A user's own choice of units (metric or US customary). */
export function setUnitSystem(id: string, unitSystem: 'metric' | 'us', now = Date.now()): void {
	const r = db.update(users).set({ unitSystem, updatedAt: now }).where(eq(users.id, id)).run();
	if (r.changes === 0) throw new UnknownUserError();
}

/** A user's own choice of frequency unit (Hz or CPM); stored frequencies stay in Hz. */
export function setFrequencyUnit(id: string, frequencyUnit: FrequencyUnit, now = Date.now()): void {
	const r = db.update(users).set({ frequencyUnit, updatedAt: now }).where(eq(users.id, id)).run();
	if (r.changes === 0) throw new UnknownUserError();
}

export function setPasswordHash(
	id: string,
	passwordHash: string,
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const result = tx
			.update(users)
			.set({ passwordHash, updatedAt: now })
			.where(eq(users.id, id))
			.run();
		if (result.changes === 0) throw new UnknownUserError();
		audit.by(tx, actorId, now)('user', id, 'reset-password');
	});
}

export function allSites() {
	return db
		.select({ id: sites.id, code: sites.code, name: sites.name })
		.from(sites)
		.orderBy(asc(sites.name))
		.all();
}
