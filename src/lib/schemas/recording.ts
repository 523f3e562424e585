/** The upload of a bump-test file: its query string (the file itself is the body). */
import { z } from 'zod';
import { SAMPLE_RATE_LIMITS } from '../recordings/types.ts';
import { sweepChoice } from '../recordings/sweep.ts';

export const recordingUploadQuery = z
	.object({
		id: z.uuid({ error: 'id must be a UUID made on the device.' }),
		assetId: z.string({ error: 'assetId is missing.' }).min(1, 'assetId is missing.').max(64),
		name: z
			.string({ error: 'name (the file name) is missing.' })
			.transform((s) => s.replace(/[\\/\0]/g, '_').slice(0, 200))
			.pipe(z.string().min(1, 'name (the file name) is missing.')),
		sampleRateHz: z.preprocess(
			(v) => (v === undefined || v === '' ? null : Number(v)),
			z
				.number({ error: 'sampleRateHz must be a number of hertz.' })
				.min(SAMPLE_RATE_LIMITS.minHz, 'sampleRateHz must be 1 Hz to 1 MHz.')
				.max(SAMPLE_RATE_LIMITS.maxHz, 'sampleRateHz must be 1 Hz to 1 MHz.')
				.nullable()
		),
		/** a record of the running machine without hits, or a run-up / coast-down */
		role: z
			.enum(['background', 'sweep'], { error: 'role: background or sweep, or leave it out.' })
			.optional(),
		/** a sweep's channel roles and orders, as JSON */
		sweep: z
			.string()
			.max(2000)
			.transform((s, ctx) => {
				try {
					return JSON.parse(s) as unknown;
				} catch {
					ctx.addIssue({ code: 'custom', message: 'sweep must be the channel roles as JSON.' });
					return z.NEVER;
				}
			})
			.pipe(sweepChoice)
			.optional(),
		/** the background recording (uploaded before) this bump test was analysed with */
		background: z.uuid({ error: 'background must be a recording id.' }).optional()
	})
	.strict()
	.refine((q) => (q.role === 'sweep') === (q.sweep !== undefined), {
		message: 'A sweep upload names its channel roles (sweep=…), and only a sweep does.'
	});
