import { describe, expect, it } from 'vitest';
// ml-matrix (registry): an independent eigenvalue solver for the two-disc torsional system.
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import {
	beamFrequenciesHz,
	beamLambda,
	cantileverFrequenciesHz,
	cantileverTipMassFrequencyHz,
	fixedFixedFrequenciesHz,
	isolationEfficiencyPct,
	massSpringFrequencyHz,
	rectangleSecondMoment,
	shaftDiscFrequencyHz,
	shaftTorsionalStiffness,
	shaftWithDiscsHz,
	simplySupportedFrequenciesHz,
	staticDeflectionFrequencyHz,
	tubeSecondMoment,
	twoDiscFrequencyHz
} from './index.ts';
import { bisect } from './testing/bisect.ts';

// domain.md E14 [C]: steel flat bar 50 × 10 mm, 1 m long, bending about the thin axis
const bar = {
	youngsModulus: 200e9,
	secondMoment: rectangleSecondMoment(0.05, 0.01),
	massPerLength: 7850 * 0.05 * 0.01,
	length: 1
};

describe('static deflection and mass–spring', () => {
	it.each([
		// domain.md E3 [C]; a public newsletter gives 6 mm → "around 6.4 Hz"
		[1, 15.76],
		[6, 6.43],
		[13, 4.37],
		[25, 3.15]
	])('δ = %s mm gives %s Hz (domain.md E3, F2: 15.761/√δ[mm])', (mm, hz) => {
		expect(staticDeflectionFrequencyHz(mm / 1000)).toBeCloseTo(hz, 2);
	});

	it('gives 187.6/√δ[in] cpm in US units (domain.md F2, g = 386.09 in/s²)', () => {
		expect(staticDeflectionFrequencyHz(0.0254) * 60).toBeCloseTo(187.6, 1);
	});

	it('sizes the air-handler isolators: r = 3 needs δ ≥ 2.6 mm; 25 mm springs isolate 98.8 % (domain.md E5, [S] newsletter, [C])', () => {
		const fe = 1750 / 60;
		const fnMax = fe / 3;
		const deltaMin = 9.80665 / (2 * Math.PI * fnMax) ** 2;
		expect(deltaMin * 1000).toBeCloseTo(2.6, 1);
		expect(staticDeflectionFrequencyHz(deltaMin)).toBeCloseTo(fnMax, 9);
		const fn = staticDeflectionFrequencyHz(0.025);
		expect(fn).toBeCloseTo(3.15, 2);
		expect(isolationEfficiencyPct(fe / fn, 0)).toBeCloseTo(98.8, 1);
	});

	it('a 4.4 Hz mount implies about 13 mm static deflection (domain.md E4 [C] 12.83 mm)', () => {
		const delta = 0.01283;
		expect(staticDeflectionFrequencyHz(delta)).toBeCloseTo(4.4, 2);
	});

	it('mass–spring matches F1', () => {
		expect(massSpringFrequencyHz(1e6, 100)).toBeCloseTo(15.9155, 4);
		expect(() => massSpringFrequencyHz(0, 1)).toThrow(/stiffness must be greater than zero/);
	});
});

describe('beams (Euler–Bernoulli)', () => {
	it('gives f1 = 8.154 Hz and f2 = 51.10 Hz for the cantilevered bar; simply supported f1 = 22.89 Hz (domain.md E14 [C])', () => {
		expect(bar.secondMoment).toBeCloseTo(4.1667e-9, 13);
		const f = cantileverFrequenciesHz(bar, 2);
		expect(f[0]).toBeCloseTo(8.154, 3);
		expect(f[1]).toBeCloseTo(51.1, 1);
		expect(simplySupportedFrequenciesHz(bar, 1)[0]).toBeCloseTo(22.89, 2);
	});

	it('uses λL that solve the frequency equations (Blevins table 8-1: cos·cosh = −1 cantilever, = +1 fixed–fixed)', () => {
		for (let i = 1; i <= 7; i++) {
			const lc = beamLambda('cantilever', i);
			const exactC = bisect((x) => 1 + Math.cos(x) * Math.cosh(x), lc - 0.05, lc + 0.05);
			expect(Math.abs(lc - exactC) / exactC).toBeLessThan(1e-8);
			const lf = beamLambda('fixed-fixed', i);
			const exactF = bisect((x) => 1 - Math.cos(x) * Math.cosh(x), lf - 0.05, lf + 0.05);
			expect(Math.abs(lf - exactF) / exactF).toBeLessThan(1e-8);
		}
		expect(beamLambda('fixed-fixed', 1) ** 2).toBeCloseTo(22.373, 3);
		expect(beamLambda('simply-supported', 2) ** 2).toBeCloseTo(39.478, 3);
	});

	it('agrees with the second published form f = (πcκ/8L²)·(1.194², 2.988², …) (Kinsler & Frey, Fundamentals of Acoustics §3.11, [S]) to 0.1 %', () => {
		const c = Math.sqrt(200e9 / 7850);
		const kappa = 0.01 / Math.sqrt(12);
		const f = cantileverFrequenciesHz(bar, 4);
		[1.194, 2.988, 5, 7].forEach((b, i) => {
			const kinsler = ((Math.PI * c * kappa) / 8) * b * b;
			expect(Math.abs(f[i] - kinsler) / kinsler).toBeLessThan(1e-3);
		});
	});

	it('orders modes with the ratio 1 : 6.267 : 17.55 : 34.39 (domain.md F10)', () => {
		const f = cantileverFrequenciesHz(bar, 4);
		expect(f[1] / f[0]).toBeCloseTo(6.267, 3);
		expect(f[2] / f[0]).toBeCloseTo(17.55, 2);
		expect(f[3] / f[0]).toBeCloseTo(34.39, 2);
		expect(fixedFixedFrequenciesHz(bar, 6)).toHaveLength(6);
		expect(
			beamFrequenciesHz(bar, 'simply-supported', 3)[2] /
				beamFrequenciesHz(bar, 'simply-supported', 3)[0]
		).toBeCloseTo(9, 9);
	});
});

describe('cantilever with a tip mass (Rayleigh)', () => {
	const mBeam = bar.massPerLength * bar.length;
	const rayleigh = (ratio: number) =>
		cantileverTipMassFrequencyHz({
			youngsModulus: bar.youngsModulus,
			secondMoment: bar.secondMoment,
			length: 1,
			beamMass: mBeam,
			tipMass: ratio * mBeam
		});

	it('over-estimates the bare cantilever by 1.47 % (coefficient 3.5675 against 3.5160; domain.md E15 [C])', () => {
		const exact = cantileverFrequenciesHz(bar, 1)[0];
		expect((rayleigh(0) / exact - 1) * 100).toBeCloseTo(1.47, 2);
		expect(Math.sqrt((3 * 140) / 33)).toBeCloseTo(3.5675, 4);
	});

	it.each([
		[0.5, 4.6829, 4.6759],
		[1, 3.6134, 3.6114],
		[2, 2.6863, 2.6859]
	])(
		'M/m_beam = %s: Rayleigh %s Hz, within 0.2 %% of the exact root (domain.md E16 [C])',
		(ratio, ray, exactTable) => {
			expect(rayleigh(ratio)).toBeCloseTo(ray, 3);
			// exact: 1 + cos λ cosh λ + (M/m)λ(cos λ sinh λ − sin λ cosh λ) = 0, solved here independently
			const lam = bisect(
				(x) =>
					1 +
					Math.cos(x) * Math.cosh(x) +
					ratio * x * (Math.cos(x) * Math.sinh(x) - Math.sin(x) * Math.cosh(x)),
				0.5,
				1.87
			);
			const exact =
				((lam * lam) / (2 * Math.PI)) *
				Math.sqrt((bar.youngsModulus * bar.secondMoment) / bar.massPerLength);
			expect(exact).toBeCloseTo(exactTable, 3);
			expect(Math.abs(rayleigh(ratio) - exact) / exact).toBeLessThan(0.002);
		}
	);

	it('refuses a massless beam with no tip mass', () => {
		expect(() =>
			cantileverTipMassFrequencyHz({
				youngsModulus: 1,
				secondMoment: 1,
				length: 1,
				beamMass: 0,
				tipMass: 0
			})
		).toThrow(/beamMass \+ tipMass/);
	});
});

describe('torsional', () => {
	it('steel shaft d = 50 mm, L = 1 m: k_t = 48 658 N·m/rad; J = 1 and 10 kg·m² give 35.107 and 11.102 Hz (domain.md E17 [C])', () => {
		const kt = shaftTorsionalStiffness({ shearModulus: 79.3e9, diameter: 0.05, length: 1 });
		expect(kt).toBeCloseTo(48658, 0);
		expect(shaftDiscFrequencyHz(kt, 1)).toBeCloseTo(35.107, 3);
		expect(shaftDiscFrequencyHz(kt, 10)).toBeCloseTo(11.102, 3);
	});

	it('two discs J1 = 2, J2 = 3 on k_t = 1e5 give 45.944 Hz (domain.md E18 [C]) and match the eigenvalues of M⁻¹K (ml-matrix)', () => {
		const f = twoDiscFrequencyHz(1e5, 2, 3);
		expect(f).toBeCloseTo(45.944, 3);
		const k = 1e5;
		const a = new Matrix([
			[k / 2, -k / 2],
			[-k / 3, k / 3]
		]);
		const eig = new EigenvalueDecomposition(a).realEigenvalues.sort((x, y) => x - y);
		expect(Math.abs(eig[0])).toBeLessThan(1e-6); // rigid-body mode
		expect(Math.abs(Math.sqrt(eig[1]) / (2 * Math.PI) - f) / f).toBeLessThan(1e-12);
	});

	it('section helpers: solid and hollow round, rectangle', () => {
		expect(tubeSecondMoment(0.1)).toBeCloseTo((Math.PI * 0.1 ** 4) / 64, 15);
		expect(tubeSecondMoment(0.1, 0.08)).toBeCloseTo((Math.PI * (0.1 ** 4 - 0.08 ** 4)) / 64, 15);
		expect(() => tubeSecondMoment(0.1, 0.1)).toThrow(
			/innerDiameter must be smaller than outerDiameter/
		);
		expect(() => beamLambda('cantilever', 0)).toThrow(/mode must be a whole number/);
	});
});

describe('a shaft with several discs (Dunkerley and Rayleigh)', () => {
	const shaft = { youngsModulus: 210e9, secondMoment: tubeSecondMoment(0.06), length: 1.2 };
	const EI = shaft.youngsModulus * shaft.secondMoment;

	/**
	 * The deflection at x under a unit load at a, found here without the closed form: the bending
	 * moment M(s) of the simply supported shaft integrated twice on a fine grid (trapezoids), the
	 * constant fixed by y(L) = 0.
	 */
	function deflection(x: number, a: number): number {
		const L = shaft.length;
		const n = 20_000;
		const h = L / n;
		const M = (s: number) => (s <= a ? ((L - a) * s) / L : (a * (L - s)) / L);
		const slope = new Float64Array(n + 1);
		const y = new Float64Array(n + 1);
		for (let i = 1; i <= n; i++)
			slope[i] = slope[i - 1] - ((M((i - 1) * h) + M(i * h)) / 2 / EI) * h;
		for (let i = 1; i <= n; i++) y[i] = y[i - 1] + ((slope[i - 1] + slope[i]) / 2) * h;
		const c = -y[n] / L; // add c·s so that y(L) = 0
		const k = Math.round(x / h);
		return y[k] + c * k * h;
	}

	it('gives the textbook answer for one disc at mid-span: ω² = 48EI/(mL³)', () => {
		const m = 50;
		const exact = Math.sqrt((48 * EI) / (m * shaft.length ** 3)) / (2 * Math.PI);
		const r = shaftWithDiscsHz(shaft, [{ mass: m, position: 0.6 }]);
		expect(r.dunkerleyHz).toBeCloseTo(exact, 9);
		expect(r.rayleighHz).toBeCloseTo(exact, 9);
	});

	it('brackets the exact first mode of three discs: Dunkerley below, Rayleigh just above', () => {
		const discs = [
			{ mass: 40, position: 0.3 },
			{ mass: 25, position: 0.7 },
			{ mass: 15, position: 1.0 }
		];
		// exact: the lowest eigenfrequency of the flexibility matrix A (numerical deflections) times
		// the mass matrix, from ml-matrix's eigen-decomposition
		const A = new Matrix(discs.map((i) => discs.map((j) => deflection(i.position, j.position))));
		const AM = A.mmul(Matrix.diag(discs.map((d) => d.mass)));
		const lambda = Math.max(...new EigenvalueDecomposition(AM).realEigenvalues);
		const exact = 1 / Math.sqrt(lambda) / (2 * Math.PI);
		const r = shaftWithDiscsHz(shaft, discs);
		expect(r.dunkerleyHz).toBeLessThan(exact);
		expect(r.rayleighHz).toBeGreaterThanOrEqual(exact * (1 - 1e-6));
		expect((r.rayleighHz - exact) / exact).toBeLessThan(0.005);
		expect((exact - r.dunkerleyHz) / exact).toBeLessThan(0.2);
	});

	it('refuses a disc outside the bearings and an empty list', () => {
		expect(() => shaftWithDiscsHz(shaft, [])).toThrow(/at least one disc/);
		expect(() => shaftWithDiscsHz(shaft, [{ mass: 5, position: 1.5 }])).toThrow(
			/between the bearings/
		);
	});
});
