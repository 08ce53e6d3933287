// The words a person reads for each request field: every refusal names its field by the label the
// forms show (μmax, not kinetics.muMaxPerH). Problems still carry the dotted path for programs.

/** Whole paths of the simulation request (and the other science requests that share a key). */
const PATH_LABELS: Record<string, string> = {
	mode: 'Operating mode',
	endH: 'End time',
	outputEveryH: 'Output every',
	maxVolumeL: 'Maximum working volume',
	dilutionPerH: 'Dilution rate D',
	kinetics: 'Kinetics',
	'kinetics.muMaxPerH': 'μmax',
	'kinetics.ksGPerL': 'Ks',
	'kinetics.yieldXS': 'Yx/s',
	'kinetics.maintenanceGPerGH': 'Maintenance mₛ',
	'kinetics.alpha': 'Product α',
	'kinetics.beta': 'Product β',
	'kinetics.yieldXO2': 'Yx/O₂',
	'kinetics.koMgPerL': 'K_O',
	initial: 'Initial state',
	'initial.biomassGPerL': 'Biomass X₀',
	'initial.substrateGPerL': 'Substrate S₀',
	'initial.volumeL': 'Volume V₀',
	'initial.productGPerL': 'Product P₀',
	'initial.dissolvedOxygenMgPerL': 'Initial DO',
	oxygen: 'Oxygen transfer',
	'oxygen.kLaPerH': 'kLa',
	'oxygen.saturationMgPerL': 'DO saturation C*',
	'oxygen.maintenanceMgPerGH': 'O₂ maintenance',
	'oxygen.limitsGrowth': 'Oxygen limits growth',
	perfusion: 'Perfusion settings',
	'perfusion.retentionEfficiency': 'Cell retention',
	'perfusion.bleedPerH': 'Bleed',
	drawFill: 'Draw-fill settings',
	'drawFill.fraction': 'Fraction drawn',
	'drawFill.everyH': 'Draw every',
	feed: 'Feed',
	feeds: 'Feed streams',
	'turnaround.cleaningH': 'Cleaning time',
	'turnaround.sterilisingH': 'Sterilising time',
	'turnaround.fillingH': 'Filling time',
	'turnaround.lagH': 'Lag time',
	'gasOff.timeS': 'Gas-off time',
	'gasOff.dissolvedOxygen': 'Gas-off DO',
	'gasOn.timeS': 'Gas-on time',
	'gasOn.dissolvedOxygen': 'Gas-on DO'
};

/** A field of one feed stream, after "Feed" or "Feed stream N". */
const FEED_FIELD_LABELS: Record<string, string> = {
	substrateGPerL: 'substrate Sf',
	startH: 'start',
	rateLPerH: 'rate F',
	slopeLPerH2: 'ramp slope',
	muSetPerH: 'μset',
	setpointGPerL: 'substrate setpoint',
	doSetpointMgPerL: 'DO setpoint',
	maxRateLPerH: 'pump maximum',
	bolusL: 'bolus at start',
	strategy: 'strategy',
	label: 'name',
	expression: 'expression'
};

/** Keys that read the same wherever they sit (chemostat, productivity, growth fit, O2 solubility). */
const KEY_LABELS: Record<string, string> = {
	muMaxPerH: 'μmax',
	ksGPerL: 'Ks',
	yieldXS: 'Yx/s',
	maintenanceGPerGH: 'Maintenance mₛ',
	feedSubstrateGPerL: 'Feed substrate Sf',
	substrateGPerL: 'Substrate S',
	biomassGPerL: 'Biomass X',
	dissolvedOxygenMgPerL: 'DO',
	inoculumGPerL: 'Inoculum X₀',
	safetyMargin: 'Safety margin below D_crit',
	sweepPoints: 'Points in the sweep',
	conversion: 'Substrate used at harvest',
	timeH: 'Time',
	minRSquared: 'Lowest R²',
	fitYield: 'Fit Yx/s',
	temperatureC: 'Temperature',
	pressureKPa: 'Pressure',
	salinityGPerKg: 'Salinity',
	method: 'Method',
	timeS: 'Time',
	dissolvedOxygen: 'DO',
	dissolvedOxygenUnit: 'DO unit',
	probeTimeConstantS: 'Probe time constant τp',
	startS: 'Start of the rise',
	gasOnStartS: 'Air back on at',
	saturationMgPerL: 'DO saturation C*'
};

export const OPERATING_MODE_WORDS: Record<string, string> = {
	batch: 'batch',
	fedBatch: 'fed-batch',
	chemostat: 'chemostat',
	perfusion: 'perfusion',
	drawFill: 'draw-fill'
};

/** Each feed strategy inside a sentence ("Feed (DO-stat) started."). */
export const FEED_STRATEGY_WORDS: Record<string, string> = {
	constant: 'constant rate',
	linear: 'linear ramp',
	exponential: 'exponential',
	substrateStat: 'substrate-stat',
	doStat: 'DO-stat',
	expression: 'expression'
};

export const FEED_STRATEGY_LABELS = {
	constant: 'Constant rate',
	linear: 'Linear ramp',
	exponential: 'Exponential (μset)',
	substrateStat: 'Substrate-stat',
	doStat: 'DO-stat',
	expression: 'Expression F(t, X, S, …)'
} as const;

/**
 * The label of a dotted request path ("kinetics.muMaxPerH" is "μmax", "feeds.1.rateLPerH" is
 * "Feed stream 2 rate F"); text that is not a known path (already a label) comes back as it is.
 */
export function fieldLabel(path: string): string {
	if (PATH_LABELS[path]) return PATH_LABELS[path];
	const stream = /^feeds\.(\d+)(?:\.(\w+))?$/.exec(path);
	if (stream) {
		const name = `Feed stream ${Number(stream[1]) + 1}`;
		return stream[2] ? `${name} ${FEED_FIELD_LABELS[stream[2]] ?? stream[2]}` : name;
	}
	const single = /^feed\.(\w+)$/.exec(path);
	if (single && FEED_FIELD_LABELS[single[1]]) return `Feed ${FEED_FIELD_LABELS[single[1]]}`;
	const lastKey = path.split('.').at(-1) ?? path;
	const indexed = /^(\w+)\.(\d+)$/.exec(path);
	if (indexed && KEY_LABELS[indexed[1]])
		return `${KEY_LABELS[indexed[1]]}, value ${Number(indexed[2]) + 1}`;
	// a key of no known request (a misspelt one) is named by its path, which is what to correct
	return KEY_LABELS[lastKey] ?? path;
}

/** A label inside a sentence: "Maximum working volume" reads "maximum working volume"; "DO setpoint" stays. */
export function inSentence(label: string): string {
	return /^[A-Z][a-z]/.test(label) ? label.charAt(0).toLowerCase() + label.slice(1) : label;
}
