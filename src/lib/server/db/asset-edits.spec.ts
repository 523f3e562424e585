import { beforeAll, describe, expect, it } from 'vitest';
import { and, eq, isNull } from 'drizzle-orm';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { auditLog, checks, users } from './schema.ts';
import { markReviewed, ReviewError, withdrawReview } from './asset-edits.ts';
import { reviewForm } from '../../schemas/asset.ts';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

describe('reviews', () => {
	it('need a comment for remarks, none for a fine review', () => {
		expect(reviewForm.safeParse({ checkId: 'c', outcome: 'remarks', comment: '' }).success).toBe(
			false
		);
		expect(reviewForm.safeParse({ checkId: 'c', outcome: 'fine', comment: '' }).success).toBe(true);
		expect(reviewForm.safeParse({ checkId: 'c', comment: 'x' }).success).toBe(false);
	});

	it('can be withdrawn within a day, on the record, and not after', () => {
		const c = db.select().from(checks).where(isNull(checks.reviewedAt)).limit(1).get()!;
		const sup = db.select().from(users).where(eq(users.role, 'supervisor')).get()!;
		const t0 = Date.UTC(2026, 11, 2, 9);
		markReviewed(c.assetId, c.id, 'remarks', 'Mode near 2×', sup.id, t0);
		expect(() => markReviewed(c.assetId, c.id, 'fine', '', sup.id, t0 + 1)).toThrow(ReviewError);
		withdrawReview(c.assetId, c.id, sup.id, t0 + 3600_000);
		const after = db.select().from(checks).where(eq(checks.id, c.id)).get()!;
		expect(after.reviewedAt).toBeNull();
		expect(after.reviewOutcome).toBeNull();
		const entry = db
			.select()
			.from(auditLog)
			.where(and(eq(auditLog.entityId, c.id), eq(auditLog.action, 'review-withdrawn')))
			.get()!;
		expect(entry.before).toMatchObject({ outcome: 'remarks', comment: 'Mode near 2×' });
		// reviewed again, and a day and a minute later it stands
		markReviewed(c.assetId, c.id, 'fine', '', sup.id, t0 + 7200_000);
		expect(() => withdrawReview(c.assetId, c.id, sup.id, t0 + 7200_000 + 86_460_000)).toThrow(
			/within a day/
		);
	});
});
