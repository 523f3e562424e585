/** The text of follow-up mail (plain text and HTML), with the cautions every report carries. */
import type { FollowUpRow } from '../db/follow-ups.ts';
import { setting } from '../config.ts';
import { escapeHtml } from '../html.ts';

const CAUTION =
	'Work near machinery only under the plant’s lock-out/tag-out and site procedures. Detune’s figures support, but never replace, a qualified engineer’s judgement and local codes.';
const esc = escapeHtml;

export function followUpMail(
	kind: 'assignment' | 'due-soon' | 'overdue' | 'retested',
	f: FollowUpRow
) {
	const origin = setting('ORIGIN') ?? 'http://localhost:3000';
	const link = `${origin}/follow-ups?id=${f.id}`;
	const lead = {
		assignment: 'A follow-up is assigned to you',
		'due-soon': 'A follow-up of yours is due soon',
		overdue: 'A follow-up of yours is overdue',
		retested: 'A clear retest has closed a follow-up'
	}[kind];
	const subject = `${{ assignment: 'Assigned', 'due-soon': 'Due soon', overdue: 'Overdue', retested: 'Closed by a retest' }[kind]}: ${f.tag} — ${f.title}`;
	const lines = [
		`${lead}.`,
		'',
		`Asset: ${f.tag} · ${f.assetName} (${f.site})`,
		`Task: ${f.title}`,
		`Due: ${f.dueDate ?? 'not set'}`,
		`Priority: ${f.priority}`,
		f.notes ? `Notes: ${f.notes}` : '',
		'',
		`Open it: ${link}`,
		'',
		CAUTION
	].filter((l, i, a) => l !== '' || a[i - 1] !== '');
	const html = `<p>${esc(lead)}.</p><table><tr><th align="left">Asset</th><td>${esc(f.tag)} · ${esc(f.assetName)} (${esc(f.site)})</td></tr><tr><th align="left">Task</th><td>${esc(f.title)}</td></tr><tr><th align="left">Due</th><td>${esc(f.dueDate ?? 'not set')}</td></tr><tr><th align="left">Priority</th><td>${esc(f.priority)}</td></tr></table>${f.notes ? `<p>${esc(f.notes)}</p>` : ''}<p><a href="${esc(link)}">Open the follow-up</a></p><p><small>${esc(CAUTION)}</small></p>`;
	return { kind, subject, text: lines.join('\n'), html };
}
