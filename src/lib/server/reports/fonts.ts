/**
 * Inter in the PDF reports: the same font files the app ships (@fontsource/inter), embedded, so
 * names and notes in Latin, Greek and Cyrillic print as typed — the PDF's built-in Helvetica
 * cannot print "Ω" or "Ж". Fontsource splits Inter by script, so each text is written in runs,
 * each in the subset that has its characters; a character no subset has prints as "?" and is
 * counted, and the report says how many.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';

const require = createRequire(import.meta.url);
const SUBSETS = ['latin', 'latin-ext', 'greek', 'greek-ext', 'cyrillic', 'cyrillic-ext'] as const;
const FAMILIES = { Body: 400, Bold: 700 } as const;
export type Family = keyof typeof FAMILIES;

interface Face {
	name: string;
	bytes: Buffer;
	has: (cp: number) => boolean;
}

const faces: Record<Family, Face[]> = { Body: [], Bold: [] };
for (const [family, weight] of Object.entries(FAMILIES) as [Family, number][])
	for (const subset of SUBSETS) {
		const bytes = readFileSync(
			require.resolve(`@fontsource/inter/files/inter-${subset}-${weight}-normal.woff`)
		);
		const font = fontkit.create(bytes) as fontkit.Font;
		faces[family].push({
			name: `${family}:${subset}`,
			bytes,
			has: (cp) => font.hasGlyphForCodePoint(cp)
		});
	}

/**
 * Signs the app's own texts use that Inter's script subsets leave out, written as a person would
 * type them (so "≥ 2.5" never prints as "? 2.5").
 */
const SPELLED: Record<string, string> = {
	'≥': '>=',
	'≤': '<=',
	'≈': '~',
	'→': '->',
	'←': '<-',
	'√': 'sqrt',
	'∞': 'inf'
};

type TextArgs = unknown[];
type Doc = PDFKit.PDFDocument;

/**
 * Gives the document the Body and Bold families: `doc.font('Body' | 'Bold')` picks a family and
 * `doc.text` writes each string in runs of the subset that covers them. Returns the count of
 * characters that could not be printed so far.
 */
export function useInter(doc: Doc): () => number {
	for (const list of Object.values(faces))
		for (const face of list) doc.registerFont(face.name, face.bytes);
	let family: Family = 'Body';
	let missing = 0;
	const setFont = doc.font.bind(doc) as (name: string, size?: number) => Doc;
	const text = doc.text.bind(doc) as (...args: TextArgs) => Doc;
	Object.assign(doc, {
		font(name: string, size?: number) {
			if (name === 'Body' || name === 'Bold') {
				family = name;
				return setFont(faces[family][0].name, size);
			}
			return setFont(name, size);
		},
		text(value: unknown, ...rest: TextArgs) {
			if (typeof value !== 'string' || value === '') return text(value, ...rest);
			const runs: { face: Face; text: string }[] = [];
			for (const typed of value) {
				const ch = faces[family][0].has(typed.codePointAt(0)!) ? typed : (SPELLED[typed] ?? typed);
				if (ch.length > 1) {
					const last = runs[runs.length - 1];
					if (last && last.face === faces[family][0]) last.text += ch;
					else runs.push({ face: faces[family][0], text: ch });
					continue;
				}
				const cp = ch.codePointAt(0)!;
				let face = faces[family].find((f) => cp < 0x20 || f.has(cp));
				let out = ch;
				if (!face) {
					face = faces[family][0];
					out = '?';
					missing++;
				}
				const last = runs[runs.length - 1];
				if (last && last.face === face) last.text += out;
				else runs.push({ face, text: out });
			}
			// text(s, x, y, options) or text(s, options): positions go with the first run only
			const opts = (typeof rest[rest.length - 1] === 'object' ? rest[rest.length - 1] : {}) as {
				continued?: boolean;
			};
			const head = typeof rest[0] === 'number' ? rest.slice(0, 2) : [];
			runs.forEach((r, i) => {
				setFont(r.face.name);
				const continued = i < runs.length - 1 ? true : (opts.continued ?? false);
				text(r.text, ...(i === 0 ? head : []), { ...opts, continued });
			});
			setFont(faces[family][0].name);
			return doc;
		}
	});
	doc.font('Body');
	return () => missing;
}
