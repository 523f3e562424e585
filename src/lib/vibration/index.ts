/**
 * Detune's vibration engine: pure TypeScript, SI units inside, no DOM, Node or framework APIs, so
 * the same code runs on the tablet, in a worker, on the server at sync and in any test runner.
 * The entry points named in the product design (oscillator, staticDeflectionFrequencyHz,
 * dampingFromLogDecrement, separationMarginPct, requiredMarginPct, bearingDefectFrequencies,
 * analyzeRingdown) keep their names and shapes: tests outside the project call them.
 */
export * from './errors.ts';
export * from './units.ts';
export * from './oscillator.ts';
export * from './estimates.ts';
export * from './damping.ts';
export * from './excitation.ts';
export * from './margins.ts';
export * from './bands.ts';
export * from './signal/ringdown.ts';
export * from './signal/frf.ts';
export { realFft, magnitude, nextPow2 } from './signal/spectrum.ts';
export * from './signal/tach.ts';
export * from './signal/orders.ts';
export * from './sweep.ts';
