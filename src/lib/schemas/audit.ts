/** The audit log's filters, as its address carries them (and its CSV export's). */
import { z } from 'zod';
import { queryToObject } from './form.ts';

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, 'a date (YYYY-MM-DD)')
	.refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)), 'a real calendar day');

export const auditQuery = z
	.object({
		asset: z.uuid({ error: 'asset: an asset id.' }),
		user: z.uuid({ error: 'user: a user id.' }),
		from: day,
		to: day
	})
	.partial()
	.strict();

export type AuditQuery = z.infer<typeof auditQuery>;

/** The address parsed, empty parameters as absent; `to` includes its whole day (UTC). */
export function parseAuditQuery(params: URLSearchParams) {
	const r = auditQuery.safeParse(queryToObject(params));
	if (!r.success) return r;
	const q = r.data;
	return {
		success: true as const,
		data: q,
		filter: {
			assetId: q.asset,
			userId: q.user,
			from: q.from ? Date.parse(`${q.from}T00:00:00Z`) : undefined,
			to: q.to ? Date.parse(`${q.to}T00:00:00Z`) + 86_400_000 : undefined
		}
	};
}
