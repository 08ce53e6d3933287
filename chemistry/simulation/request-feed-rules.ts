// The fed-batch feed's rules: its strategy against the fields it reads, and each field's range.
// Shared with request-rules.ts: the context the rules read and the reporting of a number.
import type { z } from 'zod';
import { ChemistryInputError } from '../errors';
import { compileFeedExpression } from './expression';
import { MAX_INFLOW_VOLUMES_PER_H } from './model';
import { isWithin, NON_NEGATIVE, numberMessage, POSITIVE, type Bounds } from './request-bounds';
import { FEED_STRATEGY_WORDS, fieldLabel as L, inSentence } from '../field-labels';
import type { FeedInput, simulationRequestShape } from './request-schema';

export type RequestShape = z.infer<typeof simulationRequestShape>;

/** Which feed fields each strategy reads, so a field it would ignore is refused rather than dropped. */
const FEED_FIELDS: Record<FeedInput['strategy'], readonly (keyof FeedInput)[]> = {
	constant: ['rateLPerH'],
	linear: ['rateLPerH', 'slopeLPerH2', 'maxRateLPerH'],
	exponential: ['muSetPerH', 'maxRateLPerH'],
	substrateStat: ['setpointGPerL', 'maxRateLPerH'],
	doStat: ['doSetpointMgPerL', 'maxRateLPerH'],
	expression: ['expression', 'maxRateLPerH']
};
export const FLOW_FIELDS: readonly (keyof FeedInput)[] = [
	'rateLPerH',
	'slopeLPerH2',
	'muSetPerH',
	'setpointGPerL',
	'doSetpointMgPerL',
	'expression',
	'maxRateLPerH',
	'bolusL'
];

export const given = (value: unknown) => value !== undefined && value !== null;

/** The fields the rules compare against, each null where absent or itself refused. */
export interface RuleContext {
	request: RequestShape;
	report: (field: string, message: string, position?: number) => void;
	endH: number | null;
	initialVolumeL: number | null;
	initialSubstrateGPerL: number | null;
	muMaxPerH: number | null;
	maxVolumeL: number | null;
	saturationMgPerL: number | null;
}

/** `value` when it is a finite number within `bounds`; otherwise reports it and answers null. */
export function need(
	rules: RuleContext,
	value: unknown,
	field: string,
	bounds: Bounds = {}
): number | null {
	if (isWithin(value, bounds)) return value;
	rules.report(field, numberMessage(field, value, bounds));
	return null;
}

/**
 * One fed-batch stream's strategy against its settings. `form` is 'single' for the request's
 * `feed`, whose rules stay as they were before `feeds`.
 */
export function checkFedBatchFeed(
	rules: RuleContext,
	feed: FeedInput,
	field: string,
	form: 'single' | 'streams'
): void {
	const { strategy } = feed;
	const allowed = FEED_FIELDS[strategy];
	for (const name of FLOW_FIELDS) {
		if (name !== 'bolusL' && !allowed.includes(name) && given(feed[name])) {
			rules.report(
				`${field}.${name}`,
				`${L(`${field}.${name}`)} is not used by the ${FEED_STRATEGY_WORDS[strategy]} strategy (it reads ${allowed.map((f) => L(`${field}.${f}`)).join(', ') || 'no rate field'}).`
			);
		}
	}
	const bolusL = feed.bolusL ?? 0;
	const { initialVolumeL, maxVolumeL } = rules;
	if (
		initialVolumeL !== null &&
		maxVolumeL !== null &&
		isWithin(bolusL, NON_NEGATIVE) &&
		// with no bolus, the initial volume's own rule says there is no room
		bolusL > 0 &&
		initialVolumeL + bolusL > maxVolumeL
	) {
		rules.report(
			`${field}.bolusL`,
			`${L(`${field}.bolusL`)} (${bolusL} L) would take the volume to ${initialVolumeL + bolusL} L, above the ${inSentence(L('maxVolumeL'))} (${maxVolumeL} L).`
		);
	}
	STRATEGY_RULES[strategy](rules, feed, field, form);
}

type StrategyRule = (
	rules: RuleContext,
	feed: FeedInput,
	field: string,
	form: 'single' | 'streams'
) => void;

// Substrate only falls before the feed starts, and a bolus of feed moves it towards S_f, so
// checking S_f against the initial S covers the feed start as well.
function requireFeedAboveInitial(
	rules: RuleContext,
	feed: FeedInput,
	field: string,
	why: string
): void {
	const s0 = rules.initialSubstrateGPerL;
	if (s0 === null || typeof feed.substrateGPerL !== 'number') return;
	if (feed.substrateGPerL <= s0) {
		rules.report(
			`${field}.substrateGPerL`,
			`${L(`${field}.substrateGPerL`)} (${feed.substrateGPerL} g/L) must exceed ${L('initial.substrateGPerL')} (${s0} g/L) for ${why}.`
		);
	}
}

const STRATEGY_RULES: Record<FeedInput['strategy'], StrategyRule> = {
	constant(rules, feed, field) {
		const rateLPerH = need(rules, feed.rateLPerH, `${field}.rateLPerH`, POSITIVE);
		const v0 = rules.initialVolumeL;
		if (rateLPerH !== null && v0 !== null && rateLPerH > MAX_INFLOW_VOLUMES_PER_H * v0) {
			rules.report(
				`${field}.rateLPerH`,
				`${L(`${field}.rateLPerH`)} (${rateLPerH} L/h) would bring in more than ${MAX_INFLOW_VOLUMES_PER_H} times the initial volume (${v0} L) per hour: check its units (L/h).`
			);
		}
	},
	linear(rules, feed, field) {
		const rateLPerH = need(rules, feed.rateLPerH, `${field}.rateLPerH`, NON_NEGATIVE);
		const slopeLPerH2 = need(rules, feed.slopeLPerH2, `${field}.slopeLPerH2`);
		if (rateLPerH === 0 && slopeLPerH2 !== null && slopeLPerH2 <= 0) {
			rules.report(
				`${field}.slopeLPerH2`,
				`A linear feed starting at 0 L/h needs a positive ${inSentence(L(`${field}.slopeLPerH2`))}.`
			);
		}
	},
	exponential(rules, feed, field) {
		const muSetPerH = need(rules, feed.muSetPerH, `${field}.muSetPerH`, POSITIVE);
		const muMaxPerH = rules.muMaxPerH;
		if (muSetPerH !== null && muMaxPerH !== null && muSetPerH >= muMaxPerH) {
			rules.report(
				`${field}.muSetPerH`,
				`${L(`${field}.muSetPerH`)} (${muSetPerH} /h) must be below μmax (${muMaxPerH} /h); the culture cannot grow faster than μmax.`
			);
		}
		requireFeedAboveInitial(rules, feed, field, 'an exponential feed');
	},
	substrateStat(rules, feed, field, form) {
		// Among several streams, S can only be held from below by a feed richer than the broth.
		if (form === 'streams') requireFeedAboveInitial(rules, feed, field, 'a substrate-stat feed');
		const setpointGPerL = need(rules, feed.setpointGPerL, `${field}.setpointGPerL`, POSITIVE);
		if (setpointGPerL !== null && setpointGPerL >= feed.substrateGPerL) {
			rules.report(
				`${field}.setpointGPerL`,
				`${L(`${field}.setpointGPerL`)} (${setpointGPerL} g/L) must be below the ${inSentence(L(`${field}.substrateGPerL`))} (${feed.substrateGPerL} g/L).`
			);
		}
	},
	doStat(rules, feed, field) {
		if (!rules.request.oxygen) {
			rules.report('oxygen', 'A DO-stat feed needs the oxygen balance (kLa and DO saturation C*).');
		}
		if (!given(feed.maxRateLPerH)) {
			rules.report(
				`${field}.maxRateLPerH`,
				`A DO-stat feed needs the ${inSentence(L(`${field}.maxRateLPerH`))}, the pump rate with DO above the setpoint.`
			);
		}
		const saturation = rules.saturationMgPerL;
		need(
			rules,
			feed.doSetpointMgPerL,
			`${field}.doSetpointMgPerL`,
			saturation === null ? POSITIVE : { min: 0, max: saturation }
		);
	},
	expression(rules, feed, field) {
		if (typeof feed.expression !== 'string') {
			rules.report(
				`${field}.expression`,
				`The expression strategy needs the ${inSentence(L(`${field}.expression`))}.`
			);
			return;
		}
		try {
			compileFeedExpression(feed.expression, `${field}.expression`);
		} catch (cause) {
			if (!(cause instanceof ChemistryInputError)) throw cause;
			rules.report(cause.field ?? `${field}.expression`, cause.message, cause.position);
		}
	}
};
