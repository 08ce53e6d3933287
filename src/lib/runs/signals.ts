// The signals a run records: one name for the CSV column, the API key and the stored series, with
// its unit in the name. Shared with the browser (upload help, table headers); no server code here.
import { MAX_PERCENT_SATURATION } from '$chemistry';

export type SignalKind = 'online' | 'offline';

export interface SignalDefinition {
	label: string;
	unit: string;
	kind: SignalKind;
	min: number;
	max: number;
	/** why the bounds are what they are, said when a value is refused */
	bounds: string;
}

const PERCENT_GAS = {
	unit: '% (mole, dry)',
	kind: 'online',
	min: 0,
	max: 100,
	bounds: 'a mole percentage'
} as const;

export const RUN_SIGNALS = {
	do_percent: {
		label: 'DO',
		unit: '% of air saturation',
		kind: 'online',
		min: 0,
		max: MAX_PERCENT_SATURATION,
		bounds: `above ${MAX_PERCENT_SATURATION} % of saturation with the gas in use is past calibration drift (10 %, common practice); check the probe`
	},
	do_mg_per_l: {
		label: 'DO',
		unit: 'mg/L',
		kind: 'online',
		min: 0,
		max: 60,
		bounds: 'oxygen in water at up to 1 MPa of pure O2 stays below this'
	},
	ph: { label: 'pH', unit: '', kind: 'online', min: 0, max: 14, bounds: 'the pH scale' },
	temperature_c: {
		label: 'Temperature',
		unit: '°C',
		kind: 'online',
		min: -5,
		max: 130,
		bounds: 'a culture or its sterilisation'
	},
	agitation_rpm: {
		label: 'Stirrer speed',
		unit: 'rpm',
		kind: 'online',
		min: 0,
		max: 5000,
		bounds: 'stirred vessels'
	},
	gas_flow_l_per_min: {
		label: 'Inlet gas flow',
		unit: 'L/min at the run’s stated conditions',
		kind: 'online',
		min: 0,
		max: 100000,
		bounds: 'not negative'
	},
	inlet_o2_percent: { ...PERCENT_GAS, label: 'Inlet O₂' },
	inlet_co2_percent: { ...PERCENT_GAS, label: 'Inlet CO₂' },
	exhaust_o2_percent: { ...PERCENT_GAS, label: 'Exhaust O₂' },
	exhaust_co2_percent: { ...PERCENT_GAS, label: 'Exhaust CO₂' },
	volume_l: {
		label: 'Broth volume',
		unit: 'L',
		kind: 'online',
		min: 0,
		max: 100000,
		bounds: 'not negative'
	},
	feed_volume_l: {
		label: 'Feed added',
		unit: 'L, cumulative',
		kind: 'online',
		min: 0,
		max: 100000,
		bounds: 'not negative'
	},
	od600: {
		label: 'OD600',
		unit: '',
		kind: 'offline',
		min: 0,
		max: 1000,
		bounds: 'after dilution, not negative'
	},
	dry_weight_g_per_l: {
		label: 'Dry weight',
		unit: 'g/L',
		kind: 'offline',
		min: 0,
		max: 400,
		bounds: 'packed cells'
	},
	substrate_g_per_l: {
		label: 'Substrate',
		unit: 'g/L',
		kind: 'offline',
		min: 0,
		max: 1500,
		bounds: 'not negative'
	},
	product_g_per_l: {
		label: 'Product',
		unit: 'g/L',
		kind: 'offline',
		min: 0,
		max: 1500,
		bounds: 'not negative'
	}
} as const satisfies Record<string, SignalDefinition>;

export type RunSignal = keyof typeof RUN_SIGNALS;
export const RUN_SIGNAL_NAMES = Object.keys(RUN_SIGNALS) as RunSignal[];

export function isRunSignal(name: string): name is RunSignal {
	return Object.hasOwn(RUN_SIGNALS, name);
}

/** "DO (% of air saturation)" */
export function signalTitle(signal: RunSignal): string {
	const { label, unit } = RUN_SIGNALS[signal];
	return unit ? `${label} (${unit})` : label;
}

/** The time column of a CSV: seconds, minutes or hours since the run started, or a timestamp. */
export const TIME_COLUMNS = {
	time_s: 1,
	time_min: 60,
	time_h: 3600,
	timestamp: null
} as const;
export type TimeColumn = keyof typeof TIME_COLUMNS;

/** Air's O2 mole fraction in percent; a DO probe calibrated in air reads 100 % there. */
export const AIR_O2_PERCENT = 20.95;
