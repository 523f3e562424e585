/**
 * The tablet's sensors (tap capture): kit that stays with the tablet whoever signs in, so they live
 * in the device database beside the signed-in user, not in a user's own. Read back through the
 * sensor schema: a damaged entry is dropped, not shown.
 */
import { sensorSchema, type Sensor } from '../capture/sensors.ts';
import { deviceDb } from './session.ts';

const KEY = 'sensors';

export async function listSensors(): Promise<Sensor[]> {
	const raw = await (await deviceDb()).get('meta', KEY);
	if (!Array.isArray(raw)) return [];
	return raw.flatMap((s) => {
		const p = sensorSchema.safeParse(s);
		return p.success ? [p.data] : [];
	});
}

/** Adds or replaces a sensor (by id); the list is kept in name order. */
export async function saveSensor(sensor: Sensor): Promise<Sensor[]> {
	const s = sensorSchema.parse(sensor);
	const list = (await listSensors()).filter((x) => x.id !== s.id);
	list.push(s);
	list.sort((a, b) => a.name.localeCompare(b.name));
	await (await deviceDb()).put('meta', list, KEY);
	return list;
}

export async function deleteSensor(id: string): Promise<Sensor[]> {
	const list = (await listSensors()).filter((x) => x.id !== id);
	await (await deviceDb()).put('meta', list, KEY);
	return list;
}
