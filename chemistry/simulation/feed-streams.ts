// The fed-batch feed streams during one run: their starts, laws and delivered volumes.
import { FEED_STRATEGY_WORDS } from '../field-labels';
import { formatNumber } from './events';
import { applyAddition, createFeedLaw } from './feeding';
import {
	STATE_COUNT,
	V,
	type FeedLaw,
	type FeedStreamFlow,
	type FlowPhase,
	type ModelParameters
} from './model';
import type { FeedStreamResult, SimulationEvent } from './types';
import type { FeedPlan } from './validate';

export class FeedStreams {
	/** state slots after C that integrate delivered volumes: one per stream, none for a single one */
	readonly slotCount: number;
	private readonly feeds: readonly FeedPlan[];
	private readonly p: ModelParameters;
	/** each stream's law from its start (the exponential law keeps X·V at its own start) */
	private readonly laws: (FeedLaw | null)[];
	private running: FeedStreamFlow[] = [];

	constructor(feeds: readonly FeedPlan[], p: ModelParameters) {
		this.feeds = feeds;
		this.p = p;
		this.slotCount = feeds.length > 1 ? feeds.length : 0;
		this.laws = feeds.map(() => null);
	}

	get count(): number {
		return this.feeds.length;
	}

	/**
	 * Starts the given streams at tH: mixes in their boluses (one that would overfill the vessel is
	 * cut to the room left; the maximum-volume stop then ends the run), then starts their laws on the
	 * state after all of them. Returns their feedStarted events.
	 */
	start(
		streams: readonly number[],
		tH: number,
		y: number[],
		maxVolumeL: number | null
	): SimulationEvent[] {
		const saturation = this.p.oxygen?.saturationMgPerL ?? null;
		const events: SimulationEvent[] = [];
		for (const i of streams) {
			const feed = this.feeds[i];
			// Compared as validation compares, so a bolus that exactly fills the vessel is not cut.
			const overfills = maxVolumeL !== null && y[V] + feed.bolusL > maxVolumeL;
			const bolusL = overfills ? Math.max(0, maxVolumeL - y[V]) : feed.bolusL;
			if (bolusL > 0) {
				applyAddition(y, bolusL, feed.substrateGPerL, saturation);
				if (this.slotCount > 0) y[STATE_COUNT + i] += bolusL;
			}
			if (tH > 0 || feed.bolusL > 0) {
				events.push({ kind: 'feedStarted', tH, message: this.describeStart(i, bolusL) });
			}
		}
		for (const i of streams) this.laws[i] = createFeedLaw(this.feeds[i], this.p, y);
		this.running = [];
		this.laws.forEach((feedLaw, i) => {
			if (feedLaw === null) return;
			this.running.push({
				feedLaw,
				substrateGPerL: this.feeds[i].substrateGPerL,
				stream: i,
				deliveredSlot: this.slotCount > 0 ? STATE_COUNT + i : null
			});
		});
		return events;
	}

	/** The flows of the streams started so far. */
	phase(): FlowPhase {
		return { kind: 'fed', streams: this.running };
	}

	/** Each stream as the result reports it; `y` is the final state and `initialVolumeL` V at t = 0. */
	results(
		y: readonly number[],
		initialVolumeL: number,
		/** each stream's rates; null for a lone stream, whose rate is the run's total */
		ratesLPerH: readonly (number[] | null)[]
	): FeedStreamResult[] {
		return this.feeds.map((feed, i) => ({
			label: feed.label,
			strategy: feed.strategy,
			feedLPerH: ratesLPerH[i],
			// A single stream's rate is dV/dt, so the volume gained is exactly what it delivered.
			deliveredL: this.slotCount > 0 ? y[STATE_COUNT + i] : y[V] - initialVolumeL
		}));
	}

	private describeStart(i: number, bolusL: number): string {
		const feed = this.feeds[i];
		const name =
			feed.label !== null
				? `Feed “${feed.label}”`
				: this.feeds.length > 1
					? `Feed ${i + 1} of ${this.feeds.length}`
					: 'Feed';
		let bolus = '';
		if (bolusL < feed.bolusL) {
			bolus = ` after ${formatNumber(bolusL)} L of its ${formatNumber(feed.bolusL)} L bolus (the vessel was full)`;
		} else if (bolusL > 0) {
			bolus = ` after a bolus of ${formatNumber(bolusL)} L`;
		}
		return `${name} (${FEED_STRATEGY_WORDS[feed.strategy]}) started${bolus}.`;
	}
}
