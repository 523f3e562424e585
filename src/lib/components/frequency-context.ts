import { getContext, setContext } from 'svelte';
import { DEFAULT_FREQUENCY_UNIT, type FrequencyUnit } from '$lib/frequency';

const KEY = Symbol('frequency-unit');

/**
 * The signed-in user's frequency unit for every component below: the (app) layout sets it from the
 * server's user, Floor check's layout from the tablet's. A getter, so a change in Your settings
 * shows at once. Components rendered alone (component tests) read Hz.
 */
export const provideFrequencyUnit = (get: () => FrequencyUnit) => setContext(KEY, get);

export const useFrequencyUnit = (): (() => FrequencyUnit) =>
	getContext<(() => FrequencyUnit) | undefined>(KEY) ?? (() => DEFAULT_FREQUENCY_UNIT);

/** The context a component test renders with, as the layouts would give it. */
export const frequencyUnitContext = (unit: FrequencyUnit) =>
	new Map<symbol, () => FrequencyUnit>([[KEY, () => unit]]);
