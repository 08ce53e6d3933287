// The simulation request's rules that read several fields (the mode's settings, the feed's strategy
// against its fields, volumes against the maximum, times against the end). Each refusal names its
// field; all of them are reported at once. A rule that compares with a field which is itself out of
// range stays silent: that field's own refusal says what to fix.
import type { z } from 'zod';
import {
	DEFAULT_OUTPUT_INTERVALS,
	DILUTION_BOUNDS,
	END_H_BOUNDS,
	isWithin,
	MAX_DRAW_CYCLES,
	MAX_OUTPUT_POINTS,
	MU_MAX_BOUNDS,
	NON_NEGATIVE,
	POSITIVE,
	SATURATION_BOUNDS,
	type Bounds
} from './request-bounds';
import {
	checkFedBatchFeed,
	FLOW_FIELDS,
	given,
	need,
	type RequestShape,
	type RuleContext
} from './request-feed-rules';
import type { FeedInput } from './request-schema';
import {
	FEED_STRATEGY_LABELS,
	fieldLabel as L,
	inSentence,
	OPERATING_MODE_WORDS
} from '../field-labels';

const MODE = (mode: string) => OPERATING_MODE_WORDS[mode] ?? mode;
const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

function ruleContext(request: RequestShape, ctx: z.RefinementCtx): RuleContext {
	const valid = (value: unknown, bounds: Bounds) => (isWithin(value, bounds) ? value : null);
	return {
		request,
		report: (field, message, position) =>
			ctx.addIssue({
				code: 'custom',
				path: field.split('.').map((part) => (/^\d+$/.test(part) ? Number(part) : part)),
				message,
				...(position === undefined ? {} : { params: { position } })
			}),
		endH: valid(request.endH, END_H_BOUNDS),
		initialVolumeL: valid(request.initial.volumeL, POSITIVE),
		initialSubstrateGPerL: valid(request.initial.substrateGPerL, NON_NEGATIVE),
		muMaxPerH: valid(request.kinetics.muMaxPerH, MU_MAX_BOUNDS),
		maxVolumeL: valid(request.maxVolumeL, POSITIVE),
		saturationMgPerL: request.oxygen
			? valid(request.oxygen.saturationMgPerL, SATURATION_BOUNDS)
			: null
	};
}

export function checkSimulationRequest(request: RequestShape, ctx: z.RefinementCtx): void {
	const rules = ruleContext(request, ctx);
	checkOxygen(rules);
	checkOutputCount(rules);
	checkVolumeRoom(rules);
	checkModeSettings(rules);
	if (given(request.feeds)) checkFeedStreams(rules);
	else checkSingleFeed(rules);
}

function checkOxygen({ request, report }: RuleContext): void {
	const { kinetics, initial, oxygen } = request;
	if (oxygen) {
		if (!given(kinetics.yieldXO2)) {
			report(
				'kinetics.yieldXO2',
				`${L('kinetics.yieldXO2')} (g biomass per g O₂) is required when an oxygen balance is given.`
			);
		}
		if (oxygen.limitsGrowth === false && (kinetics.koMgPerL ?? 0) > 0) {
			report(
				'kinetics.koMgPerL',
				`${L('kinetics.koMgPerL')} slows growth as DO falls, which “${L('oxygen.limitsGrowth')}: no” rules out; give one or the other.`
			);
		}
		return;
	}
	if (given(kinetics.koMgPerL)) {
		report(
			'kinetics.koMgPerL',
			`${L('kinetics.koMgPerL')} needs the oxygen balance (kLa and DO saturation C*) to have any effect.`
		);
	}
	if (given(initial.dissolvedOxygenMgPerL)) {
		report(
			'initial.dissolvedOxygenMgPerL',
			`${L('initial.dissolvedOxygenMgPerL')} needs the oxygen balance (kLa and DO saturation C*) to have any effect.`
		);
	}
}

function countOutputPoints(
	endH: number,
	outputEveryH: number
): { intervals: number; pointCount: number } {
	const intervals = Math.floor(endH / outputEveryH + 1e-9);
	const onGrid = Math.abs(intervals * outputEveryH - endH) <= 1e-9 * Math.max(1, endH);
	return { intervals, pointCount: intervals + 1 + (onGrid ? 0 : 1) };
}

/**
 * The output interval when a request gives none: the smallest round step (1, 2 or 5 × 10ⁿ h) that
 * keeps the run within DEFAULT_OUTPUT_INTERVALS intervals. Enough to draw and read a run; a finer
 * series is there for the asking, up to MAX_OUTPUT_POINTS.
 */
export function defaultOutputEveryH(endH: number): number {
	const finest = endH / DEFAULT_OUTPUT_INTERVALS;
	const decade = 10 ** Math.floor(Math.log10(finest));
	const step = [1, 2, 5, 10].map((m) => m * decade).find((s) => s >= finest * (1 - 1e-12))!;
	return Number(step.toPrecision(12));
}

/** Output times of a checked request: every `outputEveryH` from 0, and `endH` where it falls between. */
export function outputTimesH(endH: number, outputEveryH: number): number[] {
	const { intervals, pointCount } = countOutputPoints(endH, outputEveryH);
	const times = new Array<number>(pointCount);
	for (let i = 0; i <= intervals; i++) times[i] = i * outputEveryH;
	times[pointCount - 1] = endH;
	return times;
}

function checkOutputCount({ request, report, endH }: RuleContext): void {
	if (
		endH === null ||
		request.outputEveryH === undefined ||
		!isWithin(request.outputEveryH, POSITIVE)
	)
		return;
	const { pointCount } = countOutputPoints(endH, request.outputEveryH);
	if (pointCount > MAX_OUTPUT_POINTS) {
		report(
			'outputEveryH',
			`${L('outputEveryH')} gives ${pointCount} output points; at most ${MAX_OUTPUT_POINTS} are allowed (use ${L('outputEveryH')} ≥ ${(endH / (MAX_OUTPUT_POINTS - 1)).toPrecision(3)} h).`
		);
	}
}

function checkVolumeRoom({ request, report, initialVolumeL, maxVolumeL }: RuleContext): void {
	if (initialVolumeL === null || maxVolumeL === null) return;
	if (request.mode === 'fedBatch' ? initialVolumeL >= maxVolumeL : initialVolumeL > maxVolumeL) {
		report(
			'initial.volumeL',
			`${L('initial.volumeL')} (${initialVolumeL} L) leaves no room below the ${inSentence(L('maxVolumeL'))} (${maxVolumeL} L).`
		);
	}
}

/** Settings another mode reads are refused rather than ignored. */
function checkModeSettings({ request, report }: RuleContext): void {
	const { mode } = request;
	if (mode !== 'chemostat' && mode !== 'perfusion' && given(request.dilutionPerH)) {
		report('dilutionPerH', `${L('dilutionPerH')} is used only in chemostat and perfusion mode.`);
	}
	if (mode !== 'perfusion' && given(request.perfusion)) {
		report('perfusion', 'Perfusion settings are used only in perfusion mode.');
	}
	if (mode !== 'drawFill' && given(request.drawFill)) {
		report('drawFill', 'Draw-fill settings are used only in draw-fill mode.');
	}
}

/** `startH` of a feed before `endH`; answers the start (0 when absent) or null when refused. */
function checkFeedStart(rules: RuleContext, feed: FeedInput, field: string): number | null {
	const startH = feed.startH ?? 0;
	if (!isWithin(startH, NON_NEGATIVE)) return null;
	if (rules.endH !== null && startH >= rules.endH) {
		rules.report(
			`${field}.startH`,
			`${L(`${field}.startH`)} (${startH} h) must be before the end time (${rules.endH} h).`
		);
		return null;
	}
	return startH;
}

/**
 * The streams of `feeds`, each checked like the single `feed` with its fields under `feeds.N`. A
 * stream may carry none of the modelled substrate (S_f = 0, e.g. an amino-acid feed) unless its law
 * divides by S_f − S (exponential, substrate-stat).
 */
function checkFeedStreams(rules: RuleContext): void {
	const { request, report } = rules;
	if (request.mode !== 'fedBatch') {
		const instead =
			request.mode === 'batch'
				? 'a batch run takes no feed; use fed-batch mode to feed'
				: `in ${MODE(request.mode)} mode give the fresh medium as the one feed`;
		report('feeds', `Several feed streams are used only in fed-batch mode; ${instead}.`);
		return;
	}
	if (given(request.feed)) {
		report('feeds', 'Give either one feed or several feed streams, not both.');
		return;
	}
	const streams = request.feeds ?? [];
	streams.forEach((feed, i) => {
		const field = `feeds.${i}`;
		need(rules, feed.substrateGPerL, `${field}.substrateGPerL`, NON_NEGATIVE);
		checkFeedStart(rules, feed, field);
		checkFedBatchFeed(rules, feed, field, 'streams');
	});
	checkBolusesFit(rules, streams);
}

/**
 * The volume only grows in fed-batch, so boluses that add up (in start order) beyond the maximum
 * volume would overflow whatever the feeding in between.
 */
function checkBolusesFit(rules: RuleContext, streams: readonly FeedInput[]): void {
	const { maxVolumeL, initialVolumeL } = rules;
	if (maxVolumeL === null || initialVolumeL === null) return;
	const byStart = streams
		.map((feed, i) => ({ feed, i }))
		.sort((a, b) => (a.feed.startH ?? 0) - (b.feed.startH ?? 0));
	let volumeL = initialVolumeL;
	for (const { feed, i } of byStart) {
		const bolusL = feed.bolusL ?? 0;
		if (!isWithin(bolusL, NON_NEGATIVE)) return;
		volumeL += bolusL;
		if (volumeL > maxVolumeL) {
			rules.report(
				`feeds.${i}.bolusL`,
				`${L(`feeds.${i}.bolusL`)} (${bolusL} L) would take the volume, with the boluses before it, to ${volumeL} L, above the ${inSentence(L('maxVolumeL'))} (${maxVolumeL} L).`
			);
			return;
		}
	}
}

function checkSingleFeed(rules: RuleContext): void {
	const { request, report } = rules;
	const { mode, feed } = request;
	if (mode === 'batch') {
		if (given(feed)) report('feed', 'A batch run takes no feed; use fed-batch mode to feed.');
		return;
	}
	let startH: number | null = 0;
	if (feed === undefined) {
		const what = mode === 'fedBatch' ? 'a feed' : `the fresh medium (${L('feed.substrateGPerL')})`;
		report('feed', `${capitalised(MODE(mode))} mode needs ${what}.`);
	} else {
		need(rules, feed.substrateGPerL, 'feed.substrateGPerL', POSITIVE);
		startH = checkFeedStart(rules, feed, 'feed');
		if (mode === 'fedBatch') {
			checkFedBatchFeed(rules, feed, 'feed', 'single');
			return;
		}
		checkFreshMedium(rules, feed);
	}
	if (mode === 'drawFill') checkDrawFill(rules, startH);
	else if (mode !== 'fedBatch') checkContinuousFlow(rules);
}

/** In chemostat, perfusion and draw-fill the feed is fresh medium at the mode's own flow. */
function checkFreshMedium({ request, report }: RuleContext, feed: FeedInput): void {
	const { mode } = request;
	if (feed.strategy !== 'constant') {
		report(
			'feed.strategy',
			`In ${MODE(mode)} mode the feed is fresh medium at the mode’s own flow; the feed strategy must be “${FEED_STRATEGY_LABELS.constant}”.`
		);
	}
	if (given(feed.label)) {
		report(
			'feed.label',
			`A feed name belongs to a fed-batch feed stream; in ${MODE(mode)} mode the feed is the fresh medium.`
		);
	}
	const flow =
		mode === 'drawFill'
			? `${L('drawFill.fraction')} and ${L('drawFill.everyH')}`
			: `${L('dilutionPerH')} × volume`;
	for (const name of FLOW_FIELDS) {
		if (given(feed[name])) {
			report(
				`feed.${name}`,
				`${L(`feed.${name}`)} is not used in ${MODE(mode)} mode (the flow is set by ${flow}).`
			);
		}
	}
}

function checkContinuousFlow({ request, report }: RuleContext): void {
	const { mode, dilutionPerH, perfusion } = request;
	if (!given(dilutionPerH))
		report('dilutionPerH', `${capitalised(MODE(mode))} mode needs the ${L('dilutionPerH')}.`);
	if (mode !== 'perfusion') return;
	if (!perfusion) {
		report(
			'perfusion',
			`Perfusion mode needs the ${inSentence(L('perfusion.retentionEfficiency'))} and the ${inSentence(L('perfusion.bleedPerH'))}.`
		);
		return;
	}
	const { bleedPerH } = perfusion;
	if (
		isWithin(dilutionPerH, DILUTION_BOUNDS) &&
		isWithin(bleedPerH, NON_NEGATIVE) &&
		bleedPerH > dilutionPerH
	) {
		report(
			'perfusion.bleedPerH',
			`${L('perfusion.bleedPerH')} (${bleedPerH} /h) cannot exceed the ${L('dilutionPerH')} (${dilutionPerH} /h): the bleed is part of the outflow.`
		);
	}
}

function checkDrawFill({ request, report, endH }: RuleContext, startH: number | null): void {
	const { drawFill } = request;
	if (!drawFill) {
		report(
			'drawFill',
			`Draw-fill mode needs the ${inSentence(L('drawFill.fraction'))} and ${inSentence(L('drawFill.everyH'))}.`
		);
		return;
	}
	if (endH === null || startH === null || !isWithin(drawFill.everyH, POSITIVE)) return;
	if ((endH - startH) / drawFill.everyH > MAX_DRAW_CYCLES) {
		report(
			'drawFill.everyH',
			`${L('drawFill.everyH')} gives more than ${MAX_DRAW_CYCLES} draws before the end time.`
		);
	}
}
