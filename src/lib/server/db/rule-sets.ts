/** Rule sets: the required margins assets are judged by, each with its source and edition. */
import { asc, eq, sql } from 'drizzle-orm';
import { db } from './index.ts';
import { assets, ruleSets } from './schema.ts';
import { nextVersion } from './versions.ts';
import { refreshRuleSet } from './status.ts';
import * as audit from './audit.ts';
import type { RuleSetForm } from '../../schemas/rule-set.ts';

/** A refusal the form shows as it is, with its status (anything else is a server fault). */
export class RuleSetError extends Error {
	constructor(
		readonly status: 400 | 404,
		message: string
	) {
		super(message);
	}
}

export function list() {
	return db
		.select({
			id: ruleSets.id,
			name: ruleSets.name,
			kind: ruleSets.kind,
			percent: ruleSets.percent,
			perKind: ruleSets.perKind,
			source: ruleSets.source,
			edition: ruleSets.edition,
			// a join, not a correlated subquery: drizzle names a subquery's columns unqualified, and
			// `rule_set_id = id` inside it compared each asset with itself
			assets: sql<number>`count(${assets.id})`
		})
		.from(ruleSets)
		.leftJoin(assets, eq(assets.ruleSetId, ruleSets.id))
		.groupBy(ruleSets.id)
		.orderBy(asc(ruleSets.name))
		.all();
}

export function save(
	id: string | null,
	form: RuleSetForm,
	actorId: string,
	now = Date.now()
): { id: string; recomputed: number } {
	return db.transaction((tx) => {
		const version = nextVersion(tx);
		const values = {
			name: form.name,
			kind: form.kind,
			percent: form.kind === 'fixed' ? form.percent : null,
			perKind:
				form.kind === 'fixed' && Object.keys(form.perKind).length
					? (form.perKind as Record<string, number>)
					: null,
			source: form.source,
			edition: form.edition
		};
		if (id === null) {
			const newId = crypto.randomUUID();
			tx.insert(ruleSets)
				.values({ id: newId, ...values, version, createdAt: now, updatedAt: now })
				.run();
			audit.by(tx, actorId, now)('rule_set', newId, 'create', { after: values });
			return { id: newId, recomputed: 0 };
		}
		const before = tx.select().from(ruleSets).where(eq(ruleSets.id, id)).get();
		if (!before) throw new RuleSetError(404, 'No such rule set.');
		tx.update(ruleSets)
			.set({ ...values, version, updatedAt: now })
			.where(eq(ruleSets.id, id))
			.run();
		audit.by(tx, actorId, now)('rule_set', id, 'update', {
			before: {
				name: before.name,
				kind: before.kind,
				percent: before.percent,
				perKind: before.perKind,
				source: before.source,
				edition: before.edition
			},
			after: values
		});
		return { id, recomputed: refreshRuleSet(tx, id, now) };
	});
}
