import type { RequestHandler } from './$types';
import { tableToXlsx } from '$lib/server/xlsx';
import { FOLLOW_UP_COLUMNS, followUpTable } from '$lib/server/follow-up-export';

/** GET: the follow-ups (filters as on the page) as an Excel workbook. */
export const GET: RequestHandler = async (event) =>
	new Response(
		new Uint8Array(await tableToXlsx('Follow-ups', FOLLOW_UP_COLUMNS, followUpTable(event))),
		{
			headers: {
				'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
				'content-disposition': 'attachment; filename="detune-follow-ups.xlsx"'
			}
		}
	);
