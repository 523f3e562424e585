/** Enumerations both sides use (the database schema re-uses them). */
export const DIRECTIONS_LIST = ['horizontal', 'vertical', 'axial'] as const;
export const MODE_ORIGINS_LIST = ['typed', 'estimate', 'recording', 'run-up'] as const;
export const MACHINE_KINDS_LIST = [
	'pump',
	'fan',
	'blower',
	'compressor',
	'motor',
	'gearbox',
	'refiner',
	'agitator',
	'other'
] as const;
