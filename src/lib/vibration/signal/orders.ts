/**
 * Order tracking by a DFT at each order over each revolution, in shaft angle: the tachometer's
 * pulses give the angle θ(t) (linear between pulses), and order k's complex amplitude over one
 * revolution is X_k = Σ x(t_i) e^(−ikθ_i) Δθ_i / Σ Δθ_i, each Δθ_i the angle of the half-sample
 * either side of t_i inside the turn. Over a whole revolution the other whole
 * orders cancel whatever the speed, which a fixed-length FFT cannot do on a ramp. The amplitude
 * is 2|X_k| (peak) and the phase the lag of the order's peak behind the pulse, 0–360°.
 */
import { VibrationInputError, positive } from '../errors.ts';
import type { Revolutions } from './tach.ts';

export interface OrderTrack {
	order: number;
	/** per revolution: its middle time (s), mean speed (rpm), amplitude (peak, channel units), phase lag (°) */
	timeS: Float64Array;
	rpm: Float64Array;
	amplitude: Float64Array;
	phaseDeg: Float64Array;
}

/**
 * Tracks `orders` (positive whole numbers, or any positive order with a ripple from the nearby
 * whole orders) of channel `x` over every revolution of `revs`.
 */
export function trackOrders(
	x: ArrayLike<number>,
	sampleRateHz: number,
	revs: Revolutions,
	orders: readonly number[]
): OrderTrack[] {
	const fs = positive('sampleRateHz', sampleRateHz);
	for (const k of orders) positive('order', k);
	if (orders.length === 0) throw new VibrationInputError('orders', 'at least one order', orders);
	const n = revs.rpm.length;
	const nk = orders.length;
	const re = new Float64Array(nk);
	const im = new Float64Array(nk);
	const c = new Float64Array(nk);
	const s = new Float64Array(nk);
	const cr = new Float64Array(nk);
	const sr = new Float64Array(nk);
	const tracks = orders.map((order) => ({
		order,
		timeS: new Float64Array(n),
		rpm: Float64Array.from(revs.rpm),
		amplitude: new Float64Array(n),
		phaseDeg: new Float64Array(n)
	}));
	const step = (2 * Math.PI) / revs.pulsesPerRev;
	for (let r = 0; r < n; r++) {
		re.fill(0);
		im.fill(0);
		let weight = 0;
		const p0 = revs.firstPulse[r];
		for (let p = p0; p < p0 + revs.pulsesPerRev; p++) {
			const a = revs.pulseS[p];
			const b = revs.pulseS[p + 1];
			// each sample stands for the half-sample either side of it (the midpoint rule), clipped
			// to [a, b]: the weights add up to the interval's angle exactly, so the negative-frequency
			// image cancels over the turn (a plain sum over whole samples leaks about 1/N of it)
			const i0 = Math.max(0, Math.ceil(a * fs - 0.5));
			const i1 = Math.min(x.length, Math.floor(b * fs + 0.5) + 1);
			if (i1 <= i0) continue;
			const rate = step / (b - a);
			const dTheta = rate / fs;
			const theta0 = (p - p0) * step + (i0 / fs - a) * rate;
			for (let j = 0; j < nk; j++) {
				const k = orders[j];
				c[j] = Math.cos(k * theta0);
				s[j] = Math.sin(k * theta0);
				cr[j] = Math.cos(k * dTheta);
				sr[j] = Math.sin(k * dTheta);
			}
			const h = 0.5 / fs;
			for (let i = i0; i < i1; i++) {
				const t = i / fs;
				const w =
					t - h >= a && t + h <= b
						? dTheta
						: Math.max(0, Math.min(t + h, b) - Math.max(t - h, a)) * rate;
				const v = x[i] * w;
				weight += w;
				for (let j = 0; j < nk; j++) {
					re[j] += v * c[j];
					im[j] -= v * s[j];
					// rotate by k·dθ
					const cn = c[j] * cr[j] - s[j] * sr[j];
					s[j] = s[j] * cr[j] + c[j] * sr[j];
					c[j] = cn;
				}
			}
		}
		const mid = (revs.startS[r] + revs.endS[r]) / 2;
		for (let j = 0; j < nk; j++) {
			const t = tracks[j];
			t.timeS[r] = mid;
			const xr = weight > 0 ? re[j] / weight : 0;
			const xi = weight > 0 ? im[j] / weight : 0;
			t.amplitude[r] = 2 * Math.hypot(xr, xi);
			const lag = (Math.atan2(-xi, xr) * 180) / Math.PI;
			t.phaseDeg[r] = lag < 0 ? lag + 360 : lag;
		}
	}
	return tracks;
}
