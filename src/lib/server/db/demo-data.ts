/**
 * The invented demo scenario of ../shared/product.md: two plants, Kettle River Water Works and
 * Larkspur Board Mill. Every name, tag, number and person here is made up for the demo.
 * Bearing geometries are plausible invented values, not any maker's catalogue data.
 */
import type { Role } from '../../roles.ts';

export interface DemoSource {
	kind: string;
	label?: string;
	params: Record<string, unknown>;
}

export interface DemoAsset {
	tag: string;
	name: string;
	site: string;
	area: string;
	machineKind:
		| 'pump'
		| 'fan'
		| 'blower'
		| 'compressor'
		| 'motor'
		| 'gearbox'
		| 'refiner'
		| 'agitator'
		| 'other';
	driveType: 'fixed' | 'vfd';
	minRpm: number;
	maxRpm: number;
	nominalRpm: number;
	motorPoles: number;
	driveRatio: number;
	ruleSet: string;
	sources: DemoSource[];
	/** natural frequencies the demo's bump tests "found", Hz (ζ where measured) */
	modes: {
		hz: number;
		zeta?: number;
		direction: 'horizontal' | 'vertical' | 'axial';
		location: string;
	}[];
}

export const DEMO_PASSWORDS: Record<Role, string> = {
	technician: 'tech-demo-2026',
	supervisor: 'super-demo-2026',
	planner: 'plan-demo-2026',
	admin: 'admin-demo-2026'
};

export const DEMO_USERS: { email: string; name: string; role: Role; sites: string[] }[] = [
	{ email: 'tech@example.com', name: 'Tomas Ferreira', role: 'technician', sites: ['KRW'] },
	{ email: 'tech2@example.com', name: 'Ines Halvorsen', role: 'technician', sites: ['LBM'] },
	{
		email: 'super@example.com',
		name: 'Priya Natarajan',
		role: 'supervisor',
		sites: ['KRW', 'LBM']
	},
	{ email: 'planner@example.com', name: 'Dale Okonkwo', role: 'planner', sites: ['KRW', 'LBM'] },
	{ email: 'admin@example.com', name: 'Morgan Reyes', role: 'admin', sites: ['KRW', 'LBM'] }
];

export const DEMO_SITES = [
	{
		code: 'KRW',
		name: 'Kettle River Water Works',
		recheckDays: 180,
		lineFrequencyHz: 60,
		areas: [
			'Raw Water Intake',
			'Aeration',
			'Clarifiers',
			'High-Lift Station',
			'Filter Gallery',
			'Solids Handling'
		]
	},
	{
		code: 'LBM',
		name: 'Larkspur Board Mill',
		recheckDays: 120,
		lineFrequencyHz: 60,
		areas: ['Stock Preparation', 'Refining', 'Vacuum System', 'Dryer Section', 'Cooling Tower']
	}
];

export const DEMO_RULE_SETS = [
	{
		key: 'fixed10',
		name: 'Plant default ±10 %',
		kind: 'fixed' as const,
		percent: 10,
		perKind: null,
		source: 'Common practice: keep every natural frequency ±10 % from each excitation',
		edition: 'Detune default'
	},
	{
		key: 'pumps',
		name: 'Pump structures 15 %, vane pass 20 %',
		kind: 'fixed' as const,
		percent: 15,
		perKind: { vane: 20 },
		source: 'Kettle River maintenance standard MS-7 (invented for the demo)',
		edition: 'rev. C, 2025'
	},
	{
		key: 'af',
		name: 'Rotor: amplification-factor based',
		kind: 'amplification' as const,
		percent: null,
		perKind: null,
		source: 'API RP 684 style rule (AF ≥ 2.5; caps 16 % below, 26 % above)',
		edition: 'as read from public secondary sources'
	}
];

const bearing = (
	label: string,
	n: number,
	d: number,
	D: number,
	angle = 0,
	speedRatio?: number
): DemoSource => ({
	kind: 'bearing',
	label,
	params: {
		rollingElements: n,
		elementDiameter: d,
		pitchDiameter: D,
		contactAngleDeg: angle,
		...(speedRatio ? { speedRatio } : {})
	}
});
const shaft = (orders = [0.5, 1, 2, 3], speedRatio?: number, label?: string): DemoSource => ({
	kind: 'shaft',
	...(label ? { label } : {}),
	params: { orders, ...(speedRatio ? { speedRatio } : {}) }
});
const line = (hz = 60, poles?: number, ratio = 1): DemoSource => ({
	kind: 'line',
	params: { lineFrequencyHz: hz, drive: poles ? { poles, motorRpmPerShaftRpm: ratio } : null }
});

/**
 * A pump or a fan straight on its motor: 1× and 2×, vane or blade pass, a drive-end bearing on the
 * first of a row (tags ending in 1), twice line frequency (and the drive's when it has one).
 */
function impeller(kind: 'pump' | 'fan', defaultRules: string) {
	return (
		tag: string,
		name: string,
		site: string,
		area: string,
		vfd: boolean,
		min: number,
		max: number,
		count: number,
		poles: number,
		modes: DemoAsset['modes'],
		ruleSet = defaultRules
	): DemoAsset => {
		const sources = [
			shaft([1, 2]),
			{ kind: kind === 'pump' ? ('vane' as const) : ('blade' as const), params: { count } },
			...(kind === 'pump' && tag.endsWith('1') ? [bearing('DE', 9, 0.0254, 0.115)] : []),
			line(60, vfd ? poles : undefined)
		];
		return machine({
			tag,
			name,
			site,
			area,
			kind,
			speed: vfd ? [min, max] : max,
			poles,
			ruleSet,
			sources,
			modes
		});
	};
}
const pump = impeller('pump', 'pumps');
const fan = impeller('fan', 'fixed10');

type MachineSpec = Pick<DemoAsset, 'tag' | 'name' | 'site' | 'area' | 'sources' | 'modes'> & {
	kind: DemoAsset['machineKind'];
	/** a fixed speed, or the [min, max] range of a variable-frequency drive, rpm */
	speed: number | [number, number];
	/** when it is not the top of the range */
	nominal?: number;
	poles: number;
	driveRatio?: number;
	ruleSet?: string;
};

/** One demo machine, with the defaults most of them share. */
function machine({
	kind,
	speed,
	nominal,
	poles,
	driveRatio = 1,
	ruleSet = 'fixed10',
	...rest
}: MachineSpec): DemoAsset {
	const [minRpm, maxRpm] = typeof speed === 'number' ? [speed, speed] : speed;
	return {
		...rest,
		machineKind: kind,
		driveType: typeof speed === 'number' ? 'fixed' : 'vfd',
		minRpm,
		maxRpm,
		nominalRpm: nominal ?? maxRpm,
		motorPoles: poles,
		driveRatio,
		ruleSet
	};
}

const H = 'horizontal' as const;
const V = 'vertical' as const;
const A = 'axial' as const;

export const DEMO_ASSETS: DemoAsset[] = [
	// Kettle River Water Works — raw-water pumps on drives
	pump('KRW-RWP-101', 'Raw water pump 1', 'KRW', 'Raw Water Intake', true, 720, 1180, 5, 6, [
		{ hz: 17.2, zeta: 0.021, direction: H, location: 'Motor top, in line with discharge' },
		{ hz: 48.5, direction: V, location: 'Discharge head' }
	]),
	pump('KRW-RWP-102', 'Raw water pump 2', 'KRW', 'Raw Water Intake', true, 720, 1180, 5, 6, [
		{ hz: 21.9, zeta: 0.018, direction: H, location: 'Motor top, 90° to discharge' }
	]),
	pump('KRW-RWP-103', 'Raw water pump 3', 'KRW', 'Raw Water Intake', true, 720, 1180, 5, 6, [
		{ hz: 24.6, zeta: 0.03, direction: H, location: 'Motor top, in line with discharge' },
		{ hz: 30.8, direction: H, location: 'Motor top, 90° to discharge' }
	]),
	pump('KRW-RWP-104', 'Raw water pump 4', 'KRW', 'Raw Water Intake', true, 720, 1180, 5, 6, [
		{ hz: 12.1, zeta: 0.025, direction: H, location: 'Motor top' }
	]),
	pump('KRW-HLP-201', 'High-lift pump 1', 'KRW', 'High-Lift Station', false, 1185, 1185, 6, 6, [
		{ hz: 27.4, zeta: 0.04, direction: H, location: 'Outboard bearing housing' }
	]),
	pump('KRW-HLP-202', 'High-lift pump 2', 'KRW', 'High-Lift Station', false, 1185, 1185, 6, 6, [
		{ hz: 21.3, zeta: 0.035, direction: H, location: 'Outboard bearing housing' }
	]),
	pump('KRW-HLP-203', 'High-lift pump 3', 'KRW', 'High-Lift Station', true, 890, 1185, 6, 6, [
		{ hz: 33.0, direction: V, location: 'Pump casing foot' }
	]),
	pump('KRW-BWP-301', 'Backwash pump 1', 'KRW', 'Filter Gallery', true, 1200, 1780, 7, 4, [
		{ hz: 38.9, zeta: 0.02, direction: H, location: 'Inboard bearing' }
	]),
	pump('KRW-BWP-302', 'Backwash pump 2', 'KRW', 'Filter Gallery', true, 1200, 1780, 7, 4, [
		{ hz: 26.2, zeta: 0.028, direction: H, location: 'Inboard bearing' }
	]),
	pump(
		'KRW-SWP-305',
		'Surface wash pump',
		'KRW',
		'Filter Gallery',
		false,
		3560,
		3560,
		5,
		2,
		[{ hz: 71.5, direction: H, location: 'Motor NDE' }],
		'fixed10'
	),
	...[1, 2, 3, 4].map((i) =>
		machine({
			tag: `KRW-AB-40${i}`,
			name: `Aeration blower ${i}`,
			site: 'KRW',
			area: 'Aeration',
			kind: 'blower',
			speed: [2400, 3560],
			poles: 2,
			ruleSet: i <= 2 ? 'af' : 'fixed10',
			sources: [
				shaft([1, 2]),
				{ kind: 'blade', label: 'Impeller', params: { count: 13 } },
				bearing('DE', 10, 0.019, 0.085, 25),
				line(60, 2)
			],
			modes: [
				[44.8, 0.05],
				[58.3, 0.012],
				[52.5, 0.03],
				[66.0, 0.09]
			]
				.slice(i - 1, i)
				.map(([hz, zeta]) => ({ hz, zeta, direction: H, location: 'Blower casing, drive end' }))
		})
	),
	...[1, 2].map((i) =>
		machine({
			tag: `KRW-CLD-50${i}`,
			name: `Clarifier drive ${i}`,
			site: 'KRW',
			area: 'Clarifiers',
			kind: 'gearbox',
			speed: 1750,
			poles: 4,
			sources: [
				shaft([1, 2]),
				{ kind: 'gear', label: 'First stage', params: { teeth: 19, matingTeeth: 83 } },
				bearing('Input', 11, 0.0159, 0.075),
				line(60)
			],
			modes: [{ hz: i === 1 ? 31.4 : 119.0, direction: V, location: 'Gearbox input housing' }]
		})
	),
	machine({
		tag: 'KRW-SLP-601',
		name: 'Sludge transfer pump',
		site: 'KRW',
		area: 'Solids Handling',
		kind: 'pump',
		speed: 620,
		poles: 4,
		driveRatio: 2.85,
		ruleSet: 'pumps',
		sources: [
			shaft([1, 2, 3]),
			{ kind: 'vane', params: { count: 3 } },
			{ kind: 'belt', params: { sheaveDiameter: 0.14, beltLength: 2.2, speedRatio: 2.85 } },
			shaft([1], 2.85, 'Motor'),
			line(60)
		],
		modes: [{ hz: 29.0, zeta: 0.06, direction: H, location: 'Motor base' }]
	}),
	machine({
		tag: 'KRW-CMP-610',
		name: 'Plant air compressor',
		site: 'KRW',
		area: 'Solids Handling',
		kind: 'compressor',
		speed: 1780,
		poles: 4,
		sources: [
			shaft([1, 2, 4]),
			{ kind: 'gear', label: 'Bull gear', params: { teeth: 67, matingTeeth: 17 } },
			line(60)
		],
		modes: [{ hz: 88.5, direction: H, location: 'Cooler bracket' }]
	}),
	// Larkspur Board Mill
	fan('LBM-IDF-110', 'Boiler induced-draft fan', 'LBM', 'Dryer Section', true, 500, 1190, 10, 6, [
		{ hz: 16.1, zeta: 0.015, direction: H, location: 'Fan bearing pedestal' },
		{ hz: 41.0, direction: V, location: 'Fan bearing pedestal' }
	]),
	fan('LBM-FDF-111', 'Boiler forced-draft fan', 'LBM', 'Dryer Section', true, 600, 1190, 12, 6, [
		{ hz: 26.7, zeta: 0.022, direction: H, location: 'Motor NDE' }
	]),
	fan('LBM-HXF-120', 'Hood exhaust fan 1', 'LBM', 'Dryer Section', true, 700, 1780, 8, 4, [
		{ hz: 22.0, direction: H, location: 'Fan inboard bearing' }
	]),
	fan('LBM-HXF-121', 'Hood exhaust fan 2', 'LBM', 'Dryer Section', true, 700, 1780, 8, 4, [
		{ hz: 33.5, zeta: 0.02, direction: V, location: 'Fan inboard bearing' }
	]),
	fan('LBM-SAF-125', 'Supply air fan', 'LBM', 'Dryer Section', false, 1180, 1180, 9, 6, [
		{ hz: 25.9, direction: H, location: 'Structural frame' }
	]),
	machine({
		tag: 'LBM-CTF-210',
		name: 'Cooling tower fan (gearbox)',
		site: 'LBM',
		area: 'Cooling Tower',
		kind: 'fan',
		speed: [600, 1780],
		poles: 4,
		sources: [
			shaft([1, 2], undefined, 'Motor'),
			{ kind: 'gear', label: 'Right-angle set', params: { teeth: 14, matingTeeth: 161 } },
			shaft([1, 2], 14 / 161, 'Fan'),
			{ kind: 'blade', label: 'Fan', params: { count: 6, speedRatio: 14 / 161 } },
			bearing('Pinion', 13, 0.0175, 0.09, 12),
			line(60, 4)
		],
		modes: [
			{ hz: 8.9, zeta: 0.02, direction: H, location: 'Motor, on torque tube' },
			{ hz: 3.1, direction: H, location: 'Fan deck' }
		]
	}),
	machine({
		tag: 'LBM-CTF-211',
		name: 'Cooling tower fan 2 (gearbox)',
		site: 'LBM',
		area: 'Cooling Tower',
		kind: 'fan',
		speed: 1780,
		poles: 4,
		sources: [
			shaft([1, 2], undefined, 'Motor'),
			{ kind: 'gear', params: { teeth: 14, matingTeeth: 161 } },
			{ kind: 'blade', label: 'Fan', params: { count: 6, speedRatio: 14 / 161 } },
			line(60)
		],
		modes: [{ hz: 12.4, direction: H, location: 'Motor, on torque tube' }]
	}),
	...[1, 2, 3, 4].map((i) =>
		machine({
			tag: `LBM-VP-31${i}`,
			name: `Vacuum pump ${i}`,
			site: 'LBM',
			area: 'Vacuum System',
			kind: 'pump',
			speed: 505,
			poles: 6,
			driveRatio: 2.34,
			sources: [
				shaft([1, 2, 3]),
				{ kind: 'vane', label: 'Rotor', params: { count: 24 } },
				{ kind: 'belt', params: { sheaveDiameter: 0.25, beltLength: 3.6, speedRatio: 2.34 } },
				shaft([1], 2.34, 'Motor'),
				line(60)
			],
			modes: [
				{
					hz: [8.1, 17.3, 19.7, 25.2][i - 1],
					zeta: 0.03,
					direction: H,
					location: 'Pump base, drive end'
				}
			]
		})
	),
	machine({
		tag: 'LBM-RF-410',
		name: 'Double-disc refiner 1',
		site: 'LBM',
		area: 'Refining',
		kind: 'refiner',
		speed: 1200,
		poles: 6,
		sources: [shaft([1, 2, 3]), bearing('Rotor', 16, 0.032, 0.2, 15), line(60)],
		modes: [{ hz: 21.7, zeta: 0.04, direction: A, location: 'Refiner housing' }]
	}),
	machine({
		tag: 'LBM-RF-411',
		name: 'Double-disc refiner 2',
		site: 'LBM',
		area: 'Refining',
		kind: 'refiner',
		speed: [900, 1200],
		poles: 6,
		sources: [shaft([1, 2, 3]), bearing('Rotor', 16, 0.032, 0.2, 15), line(60, 6)],
		modes: [{ hz: 42.0, zeta: 0.05, direction: A, location: 'Refiner housing' }]
	}),
	pump(
		'LBM-STP-501',
		'Machine chest stock pump',
		'LBM',
		'Stock Preparation',
		true,
		900,
		1780,
		6,
		4,
		[{ hz: 36.6, zeta: 0.03, direction: H, location: 'Pump bearing frame' }],
		'fixed10'
	),
	pump(
		'LBM-STP-502',
		'Blend chest stock pump',
		'LBM',
		'Stock Preparation',
		true,
		900,
		1780,
		6,
		4,
		[{ hz: 13.0, zeta: 0.02, direction: H, location: 'Baseplate' }],
		'fixed10'
	),
	pump(
		'LBM-FPP-505',
		'Fan pump',
		'LBM',
		'Stock Preparation',
		true,
		600,
		1190,
		7,
		6,
		[
			{ hz: 23.5, zeta: 0.025, direction: H, location: 'Discharge pipe support' },
			{ hz: 81.0, direction: V, location: 'Casing' }
		],
		'fixed10'
	),
	pump(
		'LBM-WWP-507',
		'White water pump',
		'LBM',
		'Stock Preparation',
		false,
		1780,
		1780,
		6,
		4,
		[{ hz: 44.2, direction: H, location: 'Motor NDE' }],
		'fixed10'
	),
	machine({
		tag: 'LBM-AG-520',
		name: 'Pulper agitator',
		site: 'LBM',
		area: 'Stock Preparation',
		kind: 'agitator',
		speed: 1780,
		poles: 4,
		sources: [
			shaft([1, 2], undefined, 'Motor'),
			{ kind: 'gear', params: { teeth: 21, matingTeeth: 97 } },
			shaft([1], 21 / 97, 'Rotor'),
			{ kind: 'blade', label: 'Rotor', params: { count: 4, speedRatio: 21 / 97 } },
			line(60)
		],
		modes: [{ hz: 6.8, direction: H, location: 'Gearbox top' }]
	}),
	machine({
		tag: 'LBM-HPU-530',
		name: 'Press hydraulic unit',
		site: 'LBM',
		area: 'Dryer Section',
		kind: 'pump',
		speed: 1780,
		poles: 4,
		sources: [
			shaft([1, 2]),
			{ kind: 'vane', label: 'Piston', params: { count: 9 } },
			line(60),
			{ kind: 'fixed', label: 'Accumulator charge valve', params: { frequencyHz: 118 } }
		],
		modes: [{ hz: 119.5, direction: V, location: 'Tank lid' }]
	}),
	machine({
		tag: 'LBM-MOT-540',
		name: 'Dryer drive motor',
		site: 'LBM',
		area: 'Dryer Section',
		kind: 'motor',
		speed: [300, 1780],
		nominal: 1200,
		poles: 4,
		ruleSet: 'af',
		sources: [shaft([1, 2]), bearing('DE', 9, 0.0238, 0.11), line(60, 4)],
		modes: [{ hz: 24.8, zeta: 0.08, direction: H, location: 'Motor frame' }]
	}),
	machine({
		tag: 'LBM-CMP-550',
		name: 'Instrument air compressor',
		site: 'LBM',
		area: 'Vacuum System',
		kind: 'compressor',
		speed: 3570,
		poles: 2,
		sources: [shaft([1, 2]), { kind: 'gear', params: { teeth: 88, matingTeeth: 21 } }, line(60)],
		modes: [{ hz: 68.0, direction: H, location: 'Skid frame' }]
	}),
	machine({
		tag: 'LBM-BLW-560',
		name: 'Felt-run vacuum blower',
		site: 'LBM',
		area: 'Vacuum System',
		kind: 'blower',
		speed: [2000, 3580],
		nominal: 3000,
		poles: 2,
		ruleSet: 'af',
		sources: [shaft([1, 2]), { kind: 'blade', params: { count: 11 } }, line(60, 2)],
		modes: [{ hz: 51.0, zeta: 0.03, direction: H, location: 'Blower bearing housing' }]
	})
];
