import { ChemistryInputError } from '../errors';
import { compileFeedExpression, type FeedExpression } from './expression';
import { computeExhaustionThresholdGPerL, type ModelParameters } from './model';
import type { FeedInput, OperatingMode, SimulationRequest } from './types';

/** Longest run accepted: 60 days. */
export const MAX_END_H = 1440;
/** Most output points accepted in one result. */
export const MAX_OUTPUT_POINTS = 50_000;
/** Most draw-fill cycles accepted in one run. */
export const MAX_DRAW_CYCLES = 10_000;

const MODES: readonly OperatingMode[] = ['batch', 'fedBatch', 'chemostat', 'perfusion', 'drawFill'];

export type FeedPlan = {
	substrateGPerL: number;
	startH: number;
	bolusL: number;
	maxRateLPerH: number;
} & (
	| { strategy: 'constant'; rateLPerH: number }
	| { strategy: 'linear'; rateLPerH: number; slopeLPerH2: number }
	| { strategy: 'exponential'; muSetPerH: number }
	| { strategy: 'substrateStat'; setpointGPerL: number }
	| { strategy: 'doStat'; doSetpointMgPerL: number }
	| { strategy: 'expression'; expression: FeedExpression }
);

export interface SimulationPlan {
	mode: OperatingMode;
	parameters: ModelParameters;
	/** X, S, P, V, C at t = 0 */
	initialState: number[];
	endH: number;
	outputTimesH: number[];
	/** fed-batch feed; null in the other modes */
	feed: FeedPlan | null;
	/** when feeding (fed-batch), continuous flow (chemostat, perfusion) or draw cycles begin */
	startH: number;
	/** substrate of the feed or fresh medium; 0 in batch */
	feedSubstrateGPerL: number;
	maxVolumeL: number | null;
	continuous: { dilutionPerH: number; cellRemovalPerH: number } | null;
	drawFill: { fraction: number; everyH: number } | null;
}

interface Bounds {
	/** value must be > min (exclusive) or ≥ min (inclusive) */
	min?: number;
	minInclusive?: boolean;
	max?: number;
	maxInclusive?: boolean;
}

function describeBounds(b: Bounds): string {
	const parts: string[] = [];
	if (b.min !== undefined) parts.push(`${b.minInclusive ? 'at least' : 'greater than'} ${b.min}`);
	if (b.max !== undefined) parts.push(`${b.maxInclusive ? 'at most' : 'less than'} ${b.max}`);
	return parts.length ? ` ${parts.join(' and ')}` : '';
}

function readNumber(value: unknown, field: string, bounds: Bounds = {}): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ChemistryInputError(`${field} must be a finite number${describeBounds(bounds)}.`, {
			field
		});
	}
	const { min, max, minInclusive = false, maxInclusive = false } = bounds;
	const tooLow = min !== undefined && (minInclusive ? value < min : value <= min);
	const tooHigh = max !== undefined && (maxInclusive ? value > max : value >= max);
	if (tooLow || tooHigh) {
		throw new ChemistryInputError(`${field} must be${describeBounds(bounds)} (got ${value}).`, {
			field
		});
	}
	return value;
}

function readOptional(
	value: unknown,
	field: string,
	fallback: number,
	bounds: Bounds = {}
): number {
	return value === undefined || value === null ? fallback : readNumber(value, field, bounds);
}

const POSITIVE: Bounds = { min: 0 };
const NON_NEGATIVE: Bounds = { min: 0, minInclusive: true };

/** Which feed fields each strategy reads, so a field it would ignore is refused rather than dropped. */
const FEED_FIELDS: Record<FeedInput['strategy'], readonly (keyof FeedInput)[]> = {
	constant: ['rateLPerH'],
	linear: ['rateLPerH', 'slopeLPerH2', 'maxRateLPerH'],
	exponential: ['muSetPerH', 'maxRateLPerH'],
	substrateStat: ['setpointGPerL', 'maxRateLPerH'],
	doStat: ['doSetpointMgPerL', 'maxRateLPerH'],
	expression: ['expression', 'maxRateLPerH']
};
const FLOW_FIELDS: readonly (keyof FeedInput)[] = [
	'rateLPerH',
	'slopeLPerH2',
	'muSetPerH',
	'setpointGPerL',
	'doSetpointMgPerL',
	'expression',
	'maxRateLPerH',
	'bolusL'
];

export function validateSimulationRequest(request: SimulationRequest): SimulationPlan {
	if (request === null || typeof request !== 'object') {
		throw new ChemistryInputError('The simulation request must be an object.', {});
	}
	const mode = request.mode;
	if (!MODES.includes(mode)) {
		throw new ChemistryInputError(`mode must be one of ${MODES.join(', ')}.`, { field: 'mode' });
	}
	const k = request.kinetics;
	if (!k || typeof k !== 'object')
		throw new ChemistryInputError('kinetics is required.', { field: 'kinetics' });
	const muMaxPerH = readNumber(k.muMaxPerH, 'kinetics.muMaxPerH', { ...POSITIVE, max: 50 });
	const ksGPerL = readNumber(k.ksGPerL, 'kinetics.ksGPerL', POSITIVE);
	const yieldXS = readNumber(k.yieldXS, 'kinetics.yieldXS', { ...POSITIVE, max: 10 });
	const maintenanceGPerGH = readOptional(
		k.maintenanceGPerGH,
		'kinetics.maintenanceGPerGH',
		0,
		NON_NEGATIVE
	);
	const alpha = readOptional(k.alpha, 'kinetics.alpha', 0, NON_NEGATIVE);
	const beta = readOptional(k.beta, 'kinetics.beta', 0, NON_NEGATIVE);

	const init = request.initial;
	if (!init || typeof init !== 'object')
		throw new ChemistryInputError('initial is required.', { field: 'initial' });
	const x0 = readNumber(init.biomassGPerL, 'initial.biomassGPerL', POSITIVE);
	const s0 = readNumber(init.substrateGPerL, 'initial.substrateGPerL', NON_NEGATIVE);
	const v0 = readNumber(init.volumeL, 'initial.volumeL', POSITIVE);
	const p0 = readOptional(init.productGPerL, 'initial.productGPerL', 0, NON_NEGATIVE);

	let oxygen: ModelParameters['oxygen'] = null;
	let c0 = 0;
	if (request.oxygen !== undefined && request.oxygen !== null) {
		const o = request.oxygen;
		const kLaPerH = readNumber(o.kLaPerH, 'oxygen.kLaPerH', { ...POSITIVE, max: 1e4 });
		const saturationMgPerL = readNumber(o.saturationMgPerL, 'oxygen.saturationMgPerL', {
			...POSITIVE,
			max: 1000
		});
		if (k.yieldXO2 === undefined || k.yieldXO2 === null) {
			throw new ChemistryInputError(
				'kinetics.yieldXO2 (g biomass per g O2) is required when an oxygen balance is given.',
				{ field: 'kinetics.yieldXO2' }
			);
		}
		oxygen = {
			kLaPerH,
			saturationMgPerL,
			yieldXO2: readNumber(k.yieldXO2, 'kinetics.yieldXO2', { ...POSITIVE, max: 10 }),
			koMgPerL: readOptional(k.koMgPerL, 'kinetics.koMgPerL', 0, NON_NEGATIVE),
			maintenanceMgPerGH: readOptional(
				o.maintenanceMgPerGH,
				'oxygen.maintenanceMgPerGH',
				0,
				NON_NEGATIVE
			)
		};
		c0 = readOptional(
			init.dissolvedOxygenMgPerL,
			'initial.dissolvedOxygenMgPerL',
			saturationMgPerL,
			NON_NEGATIVE
		);
	} else {
		for (const field of ['yieldXO2', 'koMgPerL'] as const) {
			if (k[field] !== undefined && k[field] !== null) {
				throw new ChemistryInputError(
					`kinetics.${field} needs an oxygen block (kLaPerH, saturationMgPerL) to have any effect.`,
					{ field: `kinetics.${field}` }
				);
			}
		}
		if (init.dissolvedOxygenMgPerL !== undefined && init.dissolvedOxygenMgPerL !== null) {
			throw new ChemistryInputError(
				'initial.dissolvedOxygenMgPerL needs an oxygen block (kLaPerH, saturationMgPerL) to have any effect.',
				{ field: 'initial.dissolvedOxygenMgPerL' }
			);
		}
	}

	const endH = readNumber(request.endH, 'endH', { min: 0, max: MAX_END_H, maxInclusive: true });
	const outputEveryH = readNumber(request.outputEveryH, 'outputEveryH', POSITIVE);
	const intervals = Math.floor(endH / outputEveryH + 1e-9);
	const onGrid = Math.abs(intervals * outputEveryH - endH) <= 1e-9 * Math.max(1, endH);
	const pointCount = intervals + 1 + (onGrid ? 0 : 1);
	if (pointCount > MAX_OUTPUT_POINTS) {
		throw new ChemistryInputError(
			`outputEveryH gives ${pointCount} output points; at most ${MAX_OUTPUT_POINTS} are allowed (use outputEveryH ≥ ${(endH / (MAX_OUTPUT_POINTS - 1)).toPrecision(3)}).`,
			{ field: 'outputEveryH' }
		);
	}
	const outputTimesH = new Array<number>(pointCount);
	for (let i = 0; i <= intervals; i++) outputTimesH[i] = i * outputEveryH;
	if (onGrid) outputTimesH[intervals] = endH;
	else outputTimesH[pointCount - 1] = endH;

	const maxVolumeL =
		request.maxVolumeL === undefined || request.maxVolumeL === null
			? null
			: readNumber(request.maxVolumeL, 'maxVolumeL', POSITIVE);
	if (maxVolumeL !== null) {
		if (mode === 'fedBatch' ? v0 >= maxVolumeL : v0 > maxVolumeL) {
			throw new ChemistryInputError(
				`initial.volumeL (${v0} L) leaves no room below maxVolumeL (${maxVolumeL} L).`,
				{ field: 'initial.volumeL' }
			);
		}
	}

	const continuousMode = mode === 'chemostat' || mode === 'perfusion';
	if (!continuousMode && request.dilutionPerH !== undefined && request.dilutionPerH !== null) {
		throw new ChemistryInputError('dilutionPerH is used only in chemostat and perfusion mode.', {
			field: 'dilutionPerH'
		});
	}
	if (mode !== 'perfusion' && request.perfusion !== undefined && request.perfusion !== null) {
		throw new ChemistryInputError('perfusion settings are used only in perfusion mode.', {
			field: 'perfusion'
		});
	}
	if (mode !== 'drawFill' && request.drawFill !== undefined && request.drawFill !== null) {
		throw new ChemistryInputError('drawFill settings are used only in drawFill mode.', {
			field: 'drawFill'
		});
	}

	const parameters: ModelParameters = {
		muMaxPerH,
		ksGPerL,
		yieldXS,
		maintenanceGPerGH,
		exhaustionGPerL: computeExhaustionThresholdGPerL(ksGPerL),
		alpha,
		beta,
		oxygen
	};
	const plan: SimulationPlan = {
		mode,
		parameters,
		initialState: [x0, s0, p0, v0, c0],
		endH,
		outputTimesH,
		feed: null,
		startH: 0,
		feedSubstrateGPerL: 0,
		maxVolumeL,
		continuous: null,
		drawFill: null
	};

	const feed = request.feed;
	if (mode === 'batch') {
		if (feed !== undefined && feed !== null) {
			throw new ChemistryInputError('A batch run takes no feed; use fedBatch mode to feed.', {
				field: 'feed'
			});
		}
		return plan;
	}
	if (feed === undefined || feed === null || typeof feed !== 'object') {
		const what = mode === 'fedBatch' ? 'the feed' : 'the fresh medium (feed.substrateGPerL)';
		throw new ChemistryInputError(`${mode} mode needs ${what}.`, { field: 'feed' });
	}
	const feedSubstrateGPerL = readNumber(feed.substrateGPerL, 'feed.substrateGPerL', POSITIVE);
	const startH = readOptional(feed.startH, 'feed.startH', 0, NON_NEGATIVE);
	if (startH >= endH) {
		throw new ChemistryInputError(`feed.startH (${startH} h) must be before endH (${endH} h).`, {
			field: 'feed.startH'
		});
	}
	plan.startH = startH;
	plan.feedSubstrateGPerL = feedSubstrateGPerL;

	if (mode !== 'fedBatch') {
		if (feed.strategy !== 'constant') {
			throw new ChemistryInputError(
				`In ${mode} mode the feed is fresh medium at the mode's own flow; feed.strategy must be "constant".`,
				{ field: 'feed.strategy' }
			);
		}
		for (const name of FLOW_FIELDS) {
			if (feed[name] !== undefined && feed[name] !== null) {
				const flow =
					mode === 'drawFill' ? 'drawFill.fraction and drawFill.everyH' : 'dilutionPerH × volume';
				throw new ChemistryInputError(
					`feed.${name} is not used in ${mode} mode (the flow is set by ${flow}).`,
					{
						field: `feed.${name}`
					}
				);
			}
		}
	}

	if (continuousMode) {
		if (request.dilutionPerH === undefined || request.dilutionPerH === null) {
			throw new ChemistryInputError(`${mode} mode needs dilutionPerH.`, { field: 'dilutionPerH' });
		}
		const dilutionPerH = readNumber(request.dilutionPerH, 'dilutionPerH', {
			...POSITIVE,
			max: 100
		});
		let cellRemovalPerH = dilutionPerH;
		if (mode === 'perfusion') {
			const pf = request.perfusion;
			if (!pf || typeof pf !== 'object') {
				throw new ChemistryInputError(
					'perfusion mode needs perfusion.retentionEfficiency and perfusion.bleedPerH.',
					{
						field: 'perfusion'
					}
				);
			}
			const retention = readNumber(pf.retentionEfficiency, 'perfusion.retentionEfficiency', {
				min: 0,
				minInclusive: true,
				max: 1,
				maxInclusive: true
			});
			const bleedPerH = readNumber(pf.bleedPerH, 'perfusion.bleedPerH', NON_NEGATIVE);
			if (bleedPerH > dilutionPerH) {
				throw new ChemistryInputError(
					`perfusion.bleedPerH (${bleedPerH}) cannot exceed dilutionPerH (${dilutionPerH}): the bleed is part of the outflow.`,
					{ field: 'perfusion.bleedPerH' }
				);
			}
			cellRemovalPerH = bleedPerH + (dilutionPerH - bleedPerH) * (1 - retention);
		}
		plan.continuous = { dilutionPerH, cellRemovalPerH };
		return plan;
	}

	if (mode === 'drawFill') {
		const df = request.drawFill;
		if (!df || typeof df !== 'object') {
			throw new ChemistryInputError('drawFill mode needs drawFill.fraction and drawFill.everyH.', {
				field: 'drawFill'
			});
		}
		const fraction = readNumber(df.fraction, 'drawFill.fraction', { min: 0, max: 1 });
		const everyH = readNumber(df.everyH, 'drawFill.everyH', POSITIVE);
		if ((endH - startH) / everyH > MAX_DRAW_CYCLES) {
			throw new ChemistryInputError(
				`drawFill.everyH gives more than ${MAX_DRAW_CYCLES} draws before endH.`,
				{ field: 'drawFill.everyH' }
			);
		}
		plan.drawFill = { fraction, everyH };
		return plan;
	}

	plan.feed = readFedBatchFeed(feed, plan, feedSubstrateGPerL, startH);
	return plan;
}

function readFedBatchFeed(
	feed: FeedInput,
	plan: SimulationPlan,
	substrateGPerL: number,
	startH: number
): FeedPlan {
	const strategy = feed.strategy;
	const allowed = FEED_FIELDS[strategy];
	if (allowed === undefined) {
		throw new ChemistryInputError(
			`feed.strategy must be one of ${Object.keys(FEED_FIELDS).join(', ')}.`,
			{
				field: 'feed.strategy'
			}
		);
	}
	for (const name of FLOW_FIELDS) {
		if (
			name !== 'bolusL' &&
			!allowed.includes(name) &&
			feed[name] !== undefined &&
			feed[name] !== null
		) {
			throw new ChemistryInputError(
				`feed.${name} is not used by the ${strategy} strategy (it reads ${allowed.map((f) => `feed.${f}`).join(', ')}).`,
				{ field: `feed.${name}` }
			);
		}
	}
	const [, s0, , v0] = plan.initialState;
	const { muMaxPerH } = plan.parameters;
	const bolusL = readOptional(feed.bolusL, 'feed.bolusL', 0, NON_NEGATIVE);
	if (plan.maxVolumeL !== null && v0 + bolusL > plan.maxVolumeL) {
		throw new ChemistryInputError(
			`feed.bolusL (${bolusL} L) would take the volume to ${v0 + bolusL} L, above maxVolumeL (${plan.maxVolumeL} L).`,
			{ field: 'feed.bolusL' }
		);
	}
	const maxRateLPerH = readOptional(feed.maxRateLPerH, 'feed.maxRateLPerH', Infinity, POSITIVE);
	const common = { substrateGPerL, startH, bolusL, maxRateLPerH };
	// Substrate only falls before the feed starts, and a bolus of feed moves it towards S_f, so
	// checking S_f against the initial S covers the feed start as well.
	const requireFeedAboveInitial = (why: string) => {
		if (substrateGPerL <= s0) {
			throw new ChemistryInputError(
				`feed.substrateGPerL (${substrateGPerL} g/L) must exceed initial.substrateGPerL (${s0} g/L) for ${why}.`,
				{ field: 'feed.substrateGPerL' }
			);
		}
	};
	switch (strategy) {
		case 'constant':
			return {
				...common,
				strategy,
				rateLPerH: readNumber(feed.rateLPerH, 'feed.rateLPerH', POSITIVE)
			};
		case 'linear': {
			const rateLPerH = readNumber(feed.rateLPerH, 'feed.rateLPerH', NON_NEGATIVE);
			const slopeLPerH2 = readNumber(feed.slopeLPerH2, 'feed.slopeLPerH2');
			if (rateLPerH === 0 && slopeLPerH2 <= 0) {
				throw new ChemistryInputError(
					'A linear feed starting at 0 L/h needs a positive feed.slopeLPerH2.',
					{
						field: 'feed.slopeLPerH2'
					}
				);
			}
			return { ...common, strategy, rateLPerH, slopeLPerH2 };
		}
		case 'exponential': {
			const muSetPerH = readNumber(feed.muSetPerH, 'feed.muSetPerH', POSITIVE);
			if (muSetPerH >= muMaxPerH) {
				throw new ChemistryInputError(
					`feed.muSetPerH (${muSetPerH} /h) must be below kinetics.muMaxPerH (${muMaxPerH} /h); the culture cannot grow faster than μmax.`,
					{ field: 'feed.muSetPerH' }
				);
			}
			requireFeedAboveInitial('an exponential feed');
			return { ...common, strategy, muSetPerH };
		}
		case 'substrateStat': {
			const setpointGPerL = readNumber(feed.setpointGPerL, 'feed.setpointGPerL', POSITIVE);
			if (setpointGPerL >= substrateGPerL) {
				throw new ChemistryInputError(
					`feed.setpointGPerL (${setpointGPerL} g/L) must be below feed.substrateGPerL (${substrateGPerL} g/L).`,
					{ field: 'feed.setpointGPerL' }
				);
			}
			return { ...common, strategy, setpointGPerL };
		}
		case 'doStat': {
			const o2 = plan.parameters.oxygen;
			if (o2 === null) {
				throw new ChemistryInputError(
					'A DO-stat feed needs the oxygen block (kLaPerH, saturationMgPerL).',
					{
						field: 'oxygen'
					}
				);
			}
			if (!Number.isFinite(maxRateLPerH)) {
				throw new ChemistryInputError(
					'A DO-stat feed needs feed.maxRateLPerH, the pump rate with DO above the setpoint.',
					{
						field: 'feed.maxRateLPerH'
					}
				);
			}
			const doSetpointMgPerL = readNumber(feed.doSetpointMgPerL, 'feed.doSetpointMgPerL', {
				min: 0,
				max: o2.saturationMgPerL
			});
			return { ...common, strategy, doSetpointMgPerL };
		}
		case 'expression':
			if (typeof feed.expression !== 'string') {
				throw new ChemistryInputError('The expression strategy needs feed.expression.', {
					field: 'feed.expression'
				});
			}
			return {
				...common,
				strategy,
				expression: compileFeedExpression(feed.expression, 'feed.expression')
			};
	}
	throw new ChemistryInputError('feed.strategy is not recognised.', { field: 'feed.strategy' });
}
