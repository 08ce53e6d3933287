// The simulation form's state and its translation to and from the request of POST /api/v1/simulate.
// One table of fields drives rendering, request building and scenario loading, so they cannot drift.
import type { FeedStrategy, OperatingMode, SimulationRequest } from '$chemistry';

export type FieldGroup = 'kinetics' | 'initial' | 'feed' | 'oxygen' | 'operation';

export interface SimulationFormValues {
	mode: OperatingMode;
	strategy: FeedStrategy;
	oxygenBalance: boolean;
	expression: string;
	/** keyed by request path, e.g. `kinetics.muMaxPerH`; kept as typed so nothing is lost on error */
	numbers: Record<string, string>;
}

export interface NumberField {
	path: string;
	label: string;
	group: FieldGroup;
	required: boolean | ((v: SimulationFormValues) => boolean);
	hint?: string;
	shows?: (v: SimulationFormValues) => boolean;
}

const fed = (v: SimulationFormValues) => v.mode === 'fedBatch';
const fedWith =
	(...strategies: FeedStrategy[]) =>
	(v: SimulationFormValues) =>
		fed(v) && strategies.includes(v.strategy);
const continuous = (v: SimulationFormValues) => v.mode === 'chemostat' || v.mode === 'perfusion';

export const MODE_LABELS: Record<OperatingMode, string> = {
	batch: 'Batch',
	fedBatch: 'Fed-batch',
	chemostat: 'Chemostat',
	perfusion: 'Perfusion',
	drawFill: 'Draw-fill (repeated batch)'
};

export const STRATEGY_LABELS: Record<FeedStrategy, string> = {
	constant: 'Constant rate',
	linear: 'Linear ramp',
	exponential: 'Exponential (μset)',
	substrateStat: 'Substrate-stat',
	doStat: 'DO-stat',
	expression: 'Expression F(t, X, S, …)'
};

export const GROUP_LEGENDS: Record<FieldGroup, string> = {
	kinetics: 'Kinetics',
	initial: 'Initial state',
	feed: 'Feed',
	oxygen: 'Oxygen transfer',
	operation: 'Operation'
};

export const NUMBER_FIELDS: NumberField[] = [
	{ path: 'kinetics.muMaxPerH', label: 'μmax (1/h)', group: 'kinetics', required: true },
	{ path: 'kinetics.ksGPerL', label: 'Ks (g/L)', group: 'kinetics', required: true },
	{ path: 'kinetics.yieldXS', label: 'Yx/s (g biomass / g substrate)', group: 'kinetics', required: true },
	{ path: 'kinetics.maintenanceGPerGH', label: 'Maintenance mₛ (g/g/h)', group: 'kinetics', required: false, hint: 'Optional; Pirt 1965' },
	{ path: 'kinetics.alpha', label: 'Product α (g/g)', group: 'kinetics', required: false, hint: 'Optional; growth-associated' },
	{ path: 'kinetics.beta', label: 'Product β (g/g/h)', group: 'kinetics', required: false, hint: 'Optional; non-growth' },
	{ path: 'initial.biomassGPerL', label: 'Biomass X₀ (g/L)', group: 'initial', required: true },
	{ path: 'initial.substrateGPerL', label: 'Substrate S₀ (g/L)', group: 'initial', required: true },
	{ path: 'initial.volumeL', label: 'Volume V₀ (L)', group: 'initial', required: true },
	{ path: 'initial.productGPerL', label: 'Product P₀ (g/L)', group: 'initial', required: false, hint: 'Optional; default 0' },
	{
		path: 'feed.substrateGPerL',
		label: 'Substrate in feed or fresh medium Sf (g/L)',
		group: 'feed',
		required: true,
		shows: (v) => v.mode !== 'batch'
	},
	{ path: 'feed.startH', label: 'Start (h)', group: 'feed', required: false, hint: 'Batch phase before it; default 0', shows: (v) => v.mode !== 'batch' },
	{ path: 'feed.rateLPerH', label: 'Feed rate F (L/h)', group: 'feed', required: true, shows: fedWith('constant', 'linear') },
	{ path: 'feed.slopeLPerH2', label: 'Ramp slope (L/h²)', group: 'feed', required: true, shows: fedWith('linear') },
	{ path: 'feed.muSetPerH', label: 'Set growth rate μset (1/h)', group: 'feed', required: true, shows: fedWith('exponential') },
	{ path: 'feed.setpointGPerL', label: 'Substrate setpoint (g/L)', group: 'feed', required: true, shows: fedWith('substrateStat') },
	{ path: 'feed.doSetpointMgPerL', label: 'DO setpoint (mg/L)', group: 'feed', required: true, shows: fedWith('doStat') },
	{
		path: 'feed.maxRateLPerH',
		label: 'Pump maximum (L/h)',
		group: 'feed',
		required: (v) => v.strategy === 'doStat',
		hint: 'Caps the feed rate',
		shows: fedWith('linear', 'exponential', 'substrateStat', 'doStat', 'expression')
	},
	{ path: 'feed.bolusL', label: 'Bolus at start (L)', group: 'feed', required: false, hint: 'Optional', shows: fed },
	{ path: 'oxygen.kLaPerH', label: 'kLa (1/h)', group: 'oxygen', required: true, shows: (v) => v.oxygenBalance },
	{ path: 'oxygen.saturationMgPerL', label: 'DO saturation C* (mg/L)', group: 'oxygen', required: true, shows: (v) => v.oxygenBalance },
	{ path: 'kinetics.yieldXO2', label: 'Yx/O₂ (g biomass / g O₂)', group: 'oxygen', required: true, shows: (v) => v.oxygenBalance },
	{ path: 'kinetics.koMgPerL', label: 'K_O (mg/L)', group: 'oxygen', required: false, hint: 'Optional; 0 = growth ignores DO', shows: (v) => v.oxygenBalance },
	{ path: 'oxygen.maintenanceMgPerGH', label: 'O₂ maintenance (mg/g/h)', group: 'oxygen', required: false, hint: 'Optional', shows: (v) => v.oxygenBalance },
	{
		path: 'initial.dissolvedOxygenMgPerL',
		label: 'Initial DO (mg/L)',
		group: 'oxygen',
		required: false,
		hint: 'Optional; default C*',
		shows: (v) => v.oxygenBalance
	},
	{ path: 'dilutionPerH', label: 'Dilution rate D (1/h)', group: 'operation', required: true, shows: continuous },
	{
		path: 'perfusion.retentionEfficiency',
		label: 'Cell retention (fraction 0–1)',
		group: 'operation',
		required: true,
		shows: (v) => v.mode === 'perfusion'
	},
	{ path: 'perfusion.bleedPerH', label: 'Bleed (vessel volumes/h)', group: 'operation', required: true, shows: (v) => v.mode === 'perfusion' },
	{ path: 'drawFill.fraction', label: 'Fraction drawn (0–1)', group: 'operation', required: true, shows: (v) => v.mode === 'drawFill' },
	{ path: 'drawFill.everyH', label: 'Draw every (h)', group: 'operation', required: true, shows: (v) => v.mode === 'drawFill' },
	{ path: 'maxVolumeL', label: 'Maximum working volume (L)', group: 'operation', required: false, hint: 'The run stops there', shows: fed },
	{ path: 'endH', label: 'End time (h)', group: 'operation', required: true },
	{ path: 'outputEveryH', label: 'Output every (h)', group: 'operation', required: true }
];

export const EXPRESSION_PATH = 'feed.expression';

/** A bacterium on glucose, exponentially fed after an 8 h batch, with an O2 balance. */
export function createDemoValues(): SimulationFormValues {
	return {
		mode: 'fedBatch',
		strategy: 'exponential',
		oxygenBalance: true,
		expression: '0.05 * exp(0.2 * (t - 8))',
		numbers: {
			'kinetics.muMaxPerH': '0.6',
			'kinetics.ksGPerL': '0.05',
			'kinetics.yieldXS': '0.5',
			'kinetics.maintenanceGPerGH': '0.03',
			'kinetics.alpha': '',
			'kinetics.beta': '',
			'initial.biomassGPerL': '0.1',
			'initial.substrateGPerL': '20',
			'initial.volumeL': '5',
			'initial.productGPerL': '',
			'feed.substrateGPerL': '500',
			'feed.startH': '8',
			'feed.rateLPerH': '0.1',
			'feed.slopeLPerH2': '0.02',
			'feed.muSetPerH': '0.2',
			'feed.setpointGPerL': '0.1',
			'feed.doSetpointMgPerL': '2',
			'feed.maxRateLPerH': '',
			'feed.bolusL': '',
			'oxygen.kLaPerH': '500',
			'oxygen.saturationMgPerL': '7',
			'kinetics.yieldXO2': '1',
			'kinetics.koMgPerL': '0.1',
			'oxygen.maintenanceMgPerGH': '',
			'initial.dissolvedOxygenMgPerL': '',
			dilutionPerH: '0.3',
			'perfusion.retentionEfficiency': '0.95',
			'perfusion.bleedPerH': '0.05',
			'drawFill.fraction': '0.5',
			'drawFill.everyH': '12',
			maxVolumeL: '12',
			endH: '24',
			outputEveryH: '0.1'
		}
	};
}

export function isFieldShown(field: NumberField, values: SimulationFormValues): boolean {
	return field.shows ? field.shows(values) : true;
}

function isRequired(field: NumberField, values: SimulationFormValues): boolean {
	return typeof field.required === 'function' ? field.required(values) : field.required;
}

function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
	const keys = path.split('.');
	let node = target;
	for (const key of keys.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
	node[keys[keys.length - 1]] = value;
}

function getPath(source: unknown, path: string): unknown {
	return path.split('.').reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), source);
}

/** Reads a number as people type it; a decimal comma is accepted, anything else is refused. */
export function readNumberText(text: string): number | null {
	const cleaned = text.trim().replace(/^([+-]?\d*),(\d+)$/, '$1.$2');
	if (cleaned === '' || !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(cleaned)) return null;
	return Number(cleaned);
}

export type BuiltRequest = { ok: true; request: SimulationRequest } | { ok: false; fieldErrors: Record<string, string> };

/** The request for the fields now shown; a blank required field or a non-number is a field error. */
export function buildSimulationRequest(values: SimulationFormValues): BuiltRequest {
	const request: Record<string, unknown> = { mode: values.mode };
	const fieldErrors: Record<string, string> = {};
	for (const field of NUMBER_FIELDS) {
		if (!isFieldShown(field, values)) continue;
		const text = (values.numbers[field.path] ?? '').trim();
		if (text === '') {
			if (isRequired(field, values)) fieldErrors[field.path] = 'Required.';
			continue;
		}
		const value = readNumberText(text);
		if (value === null) fieldErrors[field.path] = `Enter a number (got “${text}”).`;
		else setPath(request, field.path, value);
	}
	if (values.mode !== 'batch') setPath(request, 'feed.strategy', values.mode === 'fedBatch' ? values.strategy : 'constant');
	if (values.mode === 'fedBatch' && values.strategy === 'expression') setPath(request, EXPRESSION_PATH, values.expression);
	if (Object.keys(fieldErrors).length) return { ok: false, fieldErrors };
	return { ok: true, request: request as unknown as SimulationRequest };
}

/** The form as it was when a scenario was saved; fields the scenario does not use keep the demo values. */
export function readSimulationRequest(request: SimulationRequest): SimulationFormValues {
	const values = createDemoValues();
	values.mode = request.mode;
	values.strategy = request.mode === 'fedBatch' && request.feed ? request.feed.strategy : values.strategy;
	values.oxygenBalance = request.oxygen !== undefined && request.oxygen !== null;
	if (typeof request.feed?.expression === 'string') values.expression = request.feed.expression;
	for (const field of NUMBER_FIELDS) {
		if (!isFieldShown(field, values)) continue;
		const value = getPath(request, field.path);
		values.numbers[field.path] = typeof value === 'number' ? String(value) : '';
	}
	return values;
}
