/** Sites and their areas (admin): the recheck interval decides when a check is stale. */
import { z } from 'zod';

const name = (what: string, max: number) =>
	z
		.string({ error: `${what}: enter a name.` })
		.trim()
		.min(2, `${what}: at least 2 characters.`)
		.max(max, `${what}: at most ${max} characters.`);

export const siteForm = z
	.object({
		code: z
			.string({ error: 'Code: enter a short code.' })
			.trim()
			.toUpperCase()
			.regex(
				/^[A-Z0-9][A-Z0-9-]{1,11}$/,
				'Code: 2–12 letters, digits or hyphens, such as KRW (it starts the asset tags).'
			),
		name: name('Name', 100),
		recheckDays: z.preprocess(
			(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v),
			z
				.number({ error: 'Recheck interval: a whole number of days.' })
				.int('Recheck interval: a whole number of days.')
				.min(7, 'Recheck interval: at least 7 days.')
				.max(3650, 'Recheck interval: at most 3650 days (10 years).')
		)
	})
	.strict();

export const siteUpdate = siteForm
	.omit({ code: true })
	.extend({ id: z.string().min(1, 'Missing site.').max(64) })
	.strict();

export const areaCreate = z
	.object({ siteId: z.string().min(1, 'Missing site.').max(64), name: name('Area', 80) })
	.strict();
export const areaRename = z
	.object({ id: z.string().min(1, 'Missing area.').max(64), name: name('Area', 80) })
	.strict();

export type SiteForm = z.infer<typeof siteForm>;
