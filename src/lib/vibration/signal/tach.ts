/**
 * A tachometer channel into shaft revolutions: pulse edges found with hysteresis (two levels, so
 * noise on an edge gives one edge, not several) and timed where the edge crosses the middle level,
 * interpolated between samples; a minimum-interval guard; missed and doubled pulses repaired from
 * their neighbours and reported; then one entry per revolution with its speed. A speed channel in
 * rpm (a drive that logs it) gives revolutions by integration instead, without a phase reference.
 */
import { integerAtLeast, positive, VibrationInputError } from '../errors.ts';

export interface TachOptions {
	/** pulses per revolution (a once-per-revolution mark is 1) */
	pulsesPerRev?: number;
	/** which edge starts a pulse; 'auto' takes the short state as the pulse */
	polarity?: 'rising' | 'falling' | 'auto';
	/** the fastest the shaft may turn; edges closer than half a pulse interval at that speed are one */
	maxRpm?: number | null;
}

export interface TachRepairs {
	/** pulses put back where one (or two) were missed */
	missing: number;
	/** pulses dropped as doubles (a second edge off the regular spacing) */
	extra: number;
	/** edges closer than the minimum interval, taken as one */
	guarded: number;
	/** the times (s) of every repair, for the flags of a resonance near one */
	repairedAtS: number[];
	/** stretches with more than two pulses missing: not filled, no revolution across them */
	gaps: { fromS: number; toS: number }[];
}

export interface Revolutions {
	/** start time of each revolution (s); revolution r runs from startS[r] to endS[r] */
	startS: Float64Array;
	endS: Float64Array;
	/** mean speed over each revolution (rpm) */
	rpm: Float64Array;
	/** the index in `pulseS` of each revolution's first pulse */
	firstPulse: Int32Array;
	/** the pulse times (s), after repair; the shaft angle is 2π/pulsesPerRev per pulse between them */
	pulseS: Float64Array;
	pulsesPerRev: number;
	polarity: 'rising' | 'falling' | 'integrated';
	repairs: TachRepairs;
	/** false when the revolutions come from a speed channel: phase has no reference */
	phaseReference: boolean;
}

/** Quantiles of a channel from up to 65 536 evenly strided samples (enough for levels). */
function levels(x: ArrayLike<number>): { lo: number; hi: number; shareHigh: number } {
	const step = Math.max(1, Math.floor(x.length / 65536));
	const s: number[] = [];
	for (let i = 0; i < x.length; i += step) s.push(x[i]);
	s.sort((a, b) => a - b);
	const q = (p: number) => s[Math.min(s.length - 1, Math.max(0, Math.round(p * (s.length - 1))))];
	const lo = q(0.001);
	const hi = q(0.999);
	const mid = (lo + hi) / 2;
	let above = 0;
	for (const v of s) if (v > mid) above++;
	return { lo, hi, shareHigh: above / s.length };
}

/**
 * Pulse edges of a tachometer channel (s). Levels at 30 % and 70 % of the channel's span (0.1 and
 * 99.9 percentiles, so a spike does not set them); an edge counts once the signal passes the far
 * level and is timed at the middle level. Returns the edge times and the polarity used.
 */
export function tachEdges(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	options: TachOptions = {}
): { edgesS: Float64Array; polarity: 'rising' | 'falling'; guarded: number } {
	const fs = positive('sampleRateHz', sampleRateHz);
	const ppr = integerAtLeast('pulsesPerRev', options.pulsesPerRev ?? 1, 1);
	const { lo, hi, shareHigh } = levels(samples);
	const span = hi - lo;
	if (!(span > 0) || !Number.isFinite(span))
		throw new VibrationInputError('tachometer channel', 'a pulse train (it is flat)', span);
	const polarity =
		options.polarity && options.polarity !== 'auto'
			? options.polarity
			: shareHigh < 0.5
				? 'rising'
				: 'falling';
	const sign = polarity === 'rising' ? 1 : -1;
	// in the pulse's own direction: armed below `low`, an edge once above `high`
	const base = polarity === 'rising' ? lo : -hi;
	const low = base + 0.3 * span;
	const high = base + 0.7 * span;
	const mid = base + 0.5 * span;
	const guardS =
		options.maxRpm != null ? 0.5 * (60 / (positive('maxRpm', options.maxRpm) * ppr)) : 0;
	const edges: number[] = [];
	let armed = sign * samples[0] < low;
	let guarded = 0;
	for (let i = 1; i < samples.length; i++) {
		const v = sign * samples[i];
		if (!armed) {
			if (v < low) armed = true;
			continue;
		}
		if (v < high) continue;
		armed = false;
		// back to the middle-level crossing, interpolated between the samples either side
		let j = i;
		while (j > 0 && sign * samples[j - 1] >= mid) j--;
		let t: number;
		if (j === 0) t = 0;
		else {
			const a = sign * samples[j - 1];
			const b = sign * samples[j];
			t = (j - 1 + (b === a ? 0 : (mid - a) / (b - a))) / fs;
		}
		if (edges.length && t - edges[edges.length - 1] < guardS) {
			guarded++;
			continue;
		}
		edges.push(t);
	}
	return { edgesS: Float64Array.from(edges), polarity, guarded };
}

/**
 * Repairs a pulse train from its neighbours, which follows a speed ramp (a global median would
 * not): an interval shorter than 0.6 of both neighbours whose sum with the next is about one
 * neighbour is a doubled pulse (the edge off the regular spacing is dropped); an interval about
 * k = 2 or 3 times both neighbours had k − 1 pulses missed (put back evenly); longer is a gap,
 * reported and left unfilled. Thresholds: common practice for keyphasor clean-up, set here.
 */
export function repairPulses(edgesS: ArrayLike<number>): {
	pulseS: Float64Array;
	repairs: Omit<TachRepairs, 'guarded'>;
} {
	let t = Array.from(edgesS);
	let extra = 0;
	let missing = 0;
	const repairedAtS: number[] = [];
	const gaps: { fromS: number; toS: number }[] = [];
	// 1. doubled pulses
	for (let i = 1; i + 2 < t.length; i++) {
		const prev = t[i] - t[i - 1];
		const d = t[i + 1] - t[i];
		const next = t[i + 2] - t[i + 1];
		const ref = Math.min(prev, next);
		if (!(d < 0.6 * ref)) continue;
		// drop whichever of the two close edges leaves the spacing more regular
		const dropSecond = Math.abs(d + next - prev) <= Math.abs(prev + d - next);
		const at = dropSecond ? i + 1 : i;
		repairedAtS.push(t[at]);
		t.splice(at, 1);
		extra++;
		i = Math.max(0, i - 2);
	}
	// 2. missed pulses and gaps
	const out: number[] = [];
	for (let i = 0; i < t.length; i++) {
		out.push(t[i]);
		if (i + 1 >= t.length || i === 0) continue;
		const d = t[i + 1] - t[i];
		const prev = t[i] - t[i - 1];
		const next = i + 2 < t.length ? t[i + 2] - t[i + 1] : prev;
		const ref = (prev + next) / 2;
		if (!(d > 1.6 * Math.max(prev, next))) continue;
		const k = Math.round(d / ref);
		if (k >= 2 && k <= 3 && Math.abs(d / ref - k) < 0.35) {
			for (let m = 1; m < k; m++) {
				out.push(t[i] + (m * d) / k);
				repairedAtS.push(t[i] + (m * d) / k);
				missing++;
			}
		} else gaps.push({ fromS: t[i], toS: t[i + 1] });
	}
	t = out;
	return { pulseS: Float64Array.from(t), repairs: { missing, extra, repairedAtS, gaps } };
}

/** Revolutions from repaired pulses: every `pulsesPerRev` pulses, none across a gap. */
function fromPulses(
	pulseS: Float64Array,
	ppr: number,
	gaps: TachRepairs['gaps']
): { startS: Float64Array; endS: Float64Array; rpm: Float64Array; firstPulse: Int32Array } {
	const start: number[] = [];
	const first: number[] = [];
	const end: number[] = [];
	// a gap runs from one kept pulse to the next
	const gapFrom = new Set(gaps.map((g) => g.fromS));
	for (let i = 0; i + ppr < pulseS.length;) {
		const a = pulseS[i];
		const b = pulseS[i + ppr];
		// a gap breaks the count: restart at the pulse after it
		let broken = -1;
		for (let j = i; j < i + ppr; j++) if (gapFrom.has(pulseS[j])) broken = j;
		if (broken >= 0) {
			i = broken + 1;
			continue;
		}
		start.push(a);
		end.push(b);
		first.push(i);
		i += ppr;
	}
	const rpm = new Float64Array(start.length);
	for (let r = 0; r < rpm.length; r++) rpm[r] = 60 / (end[r] - start[r]);
	return {
		startS: Float64Array.from(start),
		endS: Float64Array.from(end),
		rpm,
		firstPulse: Int32Array.from(first)
	};
}

/** A tachometer channel into revolutions: edges, repair, one entry per revolution. */
export function revolutionsFromTach(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	options: TachOptions = {}
): Revolutions {
	const ppr = integerAtLeast('pulsesPerRev', options.pulsesPerRev ?? 1, 1);
	const { edgesS, polarity, guarded } = tachEdges(samples, sampleRateHz, options);
	if (edgesS.length < 3 * ppr + 1)
		throw new VibrationInputError(
			'tachometer channel',
			'at least three revolutions of pulses',
			edgesS.length
		);
	const { pulseS, repairs } = repairPulses(edgesS);
	const revs = fromPulses(pulseS, ppr, repairs.gaps);
	return {
		...revs,
		pulseS,
		pulsesPerRev: ppr,
		polarity,
		repairs: { ...repairs, guarded },
		phaseReference: true
	};
}

/**
 * Revolutions from a speed channel in rpm: the shaft angle is its running integral (trapezoids),
 * a revolution ends at each whole turn. There is no once-per-revolution mark, so the phase of an
 * order has no fixed reference (only its amplitude is meaningful).
 */
export function revolutionsFromSpeed(
	rpmSamples: ArrayLike<number>,
	sampleRateHz: number
): Revolutions {
	const fs = positive('sampleRateHz', sampleRateHz);
	const pulses: number[] = [0];
	let turns = 0;
	for (let i = 1; i < rpmSamples.length; i++) {
		const a = Math.max(0, rpmSamples[i - 1]) / 60;
		const b = Math.max(0, rpmSamples[i]) / 60;
		if (!Number.isFinite(a) || !Number.isFinite(b))
			throw new VibrationInputError('speed channel', 'finite rpm values', rpmSamples[i]);
		const next = turns + (a + b) / (2 * fs);
		// each whole turn inside this step, at its interpolated time
		for (let k = Math.floor(turns) + 1; k <= next; k++)
			pulses.push((i - 1 + (k - turns) / (next - turns)) / fs);
		turns = next;
	}
	if (pulses.length < 4)
		throw new VibrationInputError('speed channel', 'at least three revolutions', pulses.length - 1);
	const pulseS = Float64Array.from(pulses);
	const revs = fromPulses(pulseS, 1, []);
	return {
		...revs,
		pulseS,
		pulsesPerRev: 1,
		polarity: 'integrated',
		repairs: { missing: 0, extra: 0, guarded: 0, repairedAtS: [], gaps: [] },
		phaseReference: false
	};
}
