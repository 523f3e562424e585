/**
 * A UFF dataset 58 file of FRFs, built by hand from the format's public field layout, for the
 * unit and end-to-end tests.
 */
const pad = (s: string) => s.padEnd(80);

// FRFs of single-degree-of-freedom modes from the handbook formula (receptance of m x'' + c x' +
// k x = F: H(ω) = 1 / (k − mω² + icω); accelerance −ω²·H), written as complex dataset 58 (record 6
// function type 4, record 7 ordinate type 5 = complex single, record 8 abscissa 18 = frequency in
// Hz, record 9 the response, record 10 the force denominator; 6E13.5 a line, real and imaginary
// parts in turn).
export interface Sdof {
	fn: number;
	zeta: number;
	m: number;
}
export const FRF_DF = 0.25;
const DF = FRF_DF;
const LINES = 2049; // 0–512 Hz
export function frfUff(modes: Sdof[], kind: 'receptance' | 'accelerance') {
	const values: number[] = [];
	for (let i = 0; i < LINES; i++) {
		const w = 2 * Math.PI * i * DF;
		let re = 0;
		let im = 0;
		for (const { fn, zeta, m } of modes) {
			const wn = 2 * Math.PI * fn;
			const a = m * wn * wn - m * w * w;
			const b = 2 * zeta * m * wn * w;
			re += a / (a * a + b * b);
			im += -b / (a * a + b * b);
		}
		const s = kind === 'accelerance' ? -w * w : 1;
		values.push(re * s, im * s);
	}
	const rows: string[] = [];
	for (let i = 0; i < values.length; i += 6)
		rows.push(
			values
				.slice(i, i + 6)
				.map((v) => v.toExponential(5).toUpperCase().padStart(13))
				.join('')
		);
	return [
		'    -1',
		'    58',
		pad('Bearing housing, vertical'),
		pad('NONE'),
		pad('02-DEC-26 10:15:00'),
		pad('NONE'),
		pad('NONE'),
		'    4         1    0         0 NONE             101   3 NONE               1   3',
		`         5${String(LINES).padStart(10)}         1  0.00000E+00${DF.toExponential(5).toUpperCase().padStart(13)}  0.00000E+00`,
		'        18    0    0    0 Frequency            Hz                  ',
		kind === 'accelerance'
			? '        12    0    0    0 Acceleration         m/s^2               '
			: '         8    0    0    0 Displacement         m                   ',
		'        13    0    0    0 Force                N                   ',
		'         0    0    0    0 NONE                 NONE                ',
		...rows,
		'    -1'
	].join('\n');
}
