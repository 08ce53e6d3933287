import { ChemistryInputError } from '../errors';
import {
	FEED_LIMIT_DEFAULTS,
	designFeeds,
	type FeedCandidate,
	type FeedDesignResult,
	type FeedLimits
} from '../feed-design';
import { assessSufficiency, type SufficiencyLine } from '../sufficiency';
import { toSufficiencyProfile } from './profile';
import type { StudyInputs } from './types';
import type { OrganismGroup } from './vocabulary';

export interface FeedDesignRequest {
	componentIds: string[];
	/** All proposed feeds together. */
	feedVolumeL: number;
	temperatureC: number;
	/** Per feed; the organism group's default when omitted. */
	osmolalityMaxMOsmPerKg?: number;
	dissolvedSolidsMaxGPerL?: number;
}

export type FeedDesign = FeedDesignResult & { limitsSource: string | null };

export type DefaultFeedLimits = FeedLimits & { source: string };

/** The limits offered for a study's organism, with where they come from. */
export function defaultFeedLimits(group: OrganismGroup): DefaultFeedLimits {
	return { ...FEED_LIMIT_DEFAULTS[group === 'mammalian' ? 'cellCulture' : 'microbial'] };
}

/** The room the vessel leaves for feed, L; a feed volume of 0 or beyond it is refused at `feedVolumeL`. */
export function requireFeedVolumeFits(inputs: StudyInputs, feedVolumeL: number): number {
	const { plan, vessel } = inputs;
	const maxFeedVolumeL = Math.max(0, vessel.maxWorkingVolumeL - plan.initialVolumeL);
	if (!(feedVolumeL > 0))
		throw new ChemistryInputError('The feed volume must be greater than 0 L.', {
			field: 'feedVolumeL'
		});
	if (feedVolumeL > maxFeedVolumeL + 1e-9) {
		throw new ChemistryInputError(
			`${feedVolumeL} L of feed on ${plan.initialVolumeL} L would exceed the vessel's maximum working volume of ${vessel.maxWorkingVolumeL} L; at most ${maxFeedVolumeL} L fits.`,
			{ field: 'feedVolumeL' }
		);
	}
	return maxFeedVolumeL;
}

/**
 * Proposes the feed(s) for a study from candidates the caller has looked up (aligned with
 * `request.componentIds`): needs are what the basal medium leaves short of safety factor × demand at
 * the final volume. Bad input throws `ChemistryInputError` at the request's field (`feedVolumeL`,
 * `candidates.N`), or without a field where the study's needs cannot be met.
 */
export function designStudyFeed(
	inputs: StudyInputs,
	candidates: FeedCandidate[],
	request: FeedDesignRequest
): FeedDesign {
	const { plan } = inputs;
	const maxFeedVolumeL = requireFeedVolumeFits(inputs, request.feedVolumeL);
	const defaults = defaultFeedLimits(inputs.profile.group);
	const limits = {
		osmolalityMaxMOsmPerKg: request.osmolalityMaxMOsmPerKg ?? defaults.osmolalityMaxMOsmPerKg,
		dissolvedSolidsMaxGPerL: request.dissolvedSolidsMaxGPerL ?? defaults.dissolvedSolidsMaxGPerL
	};
	const usesDefault =
		request.osmolalityMaxMOsmPerKg === undefined || request.dissolvedSolidsMaxGPerL === undefined;

	const finalVolumeL = plan.initialVolumeL + request.feedVolumeL;
	const { profile, carbon, substrates } = toSufficiencyProfile(inputs.profile);
	const basalOnly = assessSufficiency({
		profile,
		target:
			plan.targetBasis === 'cellsPerMl'
				? { cellsPerMl: plan.targetValue }
				: { biomassGPerL: plan.targetValue },
		supply: {
			finalVolumeL,
			sources: [{ volumeL: plan.initialVolumeL, ...inputs.basal.composition }]
		},
		safetyFactor: plan.safetyFactor,
		carbon,
		substrates
	});
	const nameOf = (l: SufficiencyLine) =>
		l.basis === 'element' ? l.key : (inputs.componentNames[l.key] ?? l.key);
	const result = designFeeds({
		candidates,
		needs: basalOnly.lines.map((l) => ({
			key: l.key,
			name: nameOf(l),
			requiredGPerLFinal: plan.safetyFactor * l.demandGPerL,
			presentG: l.supplyGPerL * finalVolumeL
		})),
		initialVolumeL: plan.initialVolumeL,
		feedVolumeL: request.feedVolumeL,
		maxFeedVolumeL,
		temperatureC: request.temperatureC,
		...limits
	});
	return { ...result, limitsSource: usesDefault ? defaults.source : null };
}
