import { ChemistryInputError } from '../errors';
import type { ModelParameters } from './model';
import { isGiven, NON_NEGATIVE, POSITIVE, readNumber, readOptional } from './read-number';
import type { OperatingMode, SimulationRequest } from './types';
import { FLOW_FIELDS, readFedBatchFeed, readFeedStreams, type FeedPlan } from './validate-feed';

export type { FeedPlan } from './validate-feed';

/** Longest run accepted: 60 days. */
export const MAX_END_H = 1440;
/** Most output points accepted in one result. */
export const MAX_OUTPUT_POINTS = 50_000;
/** Most draw-fill cycles accepted in one run. */
export const MAX_DRAW_CYCLES = 10_000;

const MODES: readonly OperatingMode[] = ['batch', 'fedBatch', 'chemostat', 'perfusion', 'drawFill'];

export interface SimulationPlan {
	mode: OperatingMode;
	parameters: ModelParameters;
	/** X, S, P, V, C at t = 0 */
	initialState: number[];
	endH: number;
	outputTimesH: number[];
	/** fed-batch feed streams in request order (one for the single `feed`); null in the other modes */
	feeds: FeedPlan[] | null;
	/**
	 * when feeding (fed-batch: the earliest stream), continuous flow (chemostat, perfusion) or draw
	 * cycles begin
	 */
	startH: number;
	/**
	 * substrate of the fresh medium (chemostat, perfusion, draw-fill) or of the single `feed`; 0 in
	 * batch and with `feeds` (fed-batch integration reads each stream's own)
	 */
	feedSubstrateGPerL: number;
	maxVolumeL: number | null;
	continuous: { dilutionPerH: number; cellRemovalPerH: number } | null;
	drawFill: { fraction: number; everyH: number } | null;
}

function readLimitsGrowth(value: unknown): boolean {
	if (value === undefined || value === null) return true;
	if (typeof value !== 'boolean') {
		throw new ChemistryInputError('oxygen.limitsGrowth must be true or false.', {
			field: 'oxygen.limitsGrowth'
		});
	}
	return value;
}

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
	let demandYieldXO2: number | null = null;
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
			),
			limitsGrowth: readLimitsGrowth(o.limitsGrowth)
		};
		if (!oxygen.limitsGrowth && oxygen.koMgPerL > 0) {
			throw new ChemistryInputError(
				'kinetics.koMgPerL slows growth as DO falls, which oxygen.limitsGrowth: false rules out; give one or the other.',
				{ field: 'kinetics.koMgPerL' }
			);
		}
		c0 = readOptional(
			init.dissolvedOxygenMgPerL,
			'initial.dissolvedOxygenMgPerL',
			saturationMgPerL,
			NON_NEGATIVE
		);
	} else {
		if (k.koMgPerL !== undefined && k.koMgPerL !== null) {
			throw new ChemistryInputError(
				'kinetics.koMgPerL needs an oxygen block (kLaPerH, saturationMgPerL) to have any effect.',
				{ field: 'kinetics.koMgPerL' }
			);
		}
		// Without a transfer balance, Yx/O2 gives the O2 demand of the simulated growth.
		if (k.yieldXO2 !== undefined && k.yieldXO2 !== null) {
			demandYieldXO2 = readNumber(k.yieldXO2, 'kinetics.yieldXO2', { ...POSITIVE, max: 10 });
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
		alpha,
		beta,
		oxygen,
		demandYieldXO2
	};
	const plan: SimulationPlan = {
		mode,
		parameters,
		initialState: [x0, s0, p0, v0, c0],
		endH,
		outputTimesH,
		feeds: null,
		startH: 0,
		feedSubstrateGPerL: 0,
		maxVolumeL,
		continuous: null,
		drawFill: null
	};

	if (isGiven(request.feeds)) {
		const feeds = readFeedStreams(request, plan);
		plan.feeds = feeds;
		plan.startH = Math.min(...feeds.map((feed) => feed.startH));
		return plan;
	}
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
		if (isGiven(feed.label)) {
			throw new ChemistryInputError(
				`feed.label names a fed-batch feed stream; in ${mode} mode the feed is the fresh medium.`,
				{ field: 'feed.label' }
			);
		}
		for (const name of FLOW_FIELDS) {
			if (isGiven(feed[name])) {
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

	plan.feeds = [
		readFedBatchFeed(feed, plan, {
			field: 'feed',
			substrateGPerL: feedSubstrateGPerL,
			startH,
			form: 'single'
		})
	];
	return plan;
}
