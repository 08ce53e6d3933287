import {
	ChemistryInputError,
	FEED_LIMIT_DEFAULTS,
	assessSufficiency,
	designFeeds,
	type FeedCandidate,
	type FeedDesignResult,
	type FeedLimits,
	type SufficiencyLine
} from '$chemistry';
import type { OrganismGroup } from '$lib/studies';
import type { Component } from '../db/schema';
import { componentSpecOf, molarMassOfComponent } from '../components/library';
import { RuleError } from '../rule-error';
import { toSufficiencyProfile } from './profiles';
import type { StudyInputs } from './types';

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

/**
 * The substance a component is a form of: the end of its basis chain (MgSO4·7H2O → MgSO4,
 * L-lysine·HCl → L-lysine), or itself.
 */
export function substanceIdOf(id: string, components: Map<string, Component>): string {
	let current = id;
	for (let depth = 0; depth < 5; depth++) {
		const basis = components.get(current)?.basisComponentId;
		if (!basis || !components.has(basis)) break;
		current = basis;
	}
	return current;
}

/**
 * One form per substance, in the order given: a form that is weighed wins over the basis form it is
 * counted as (a feed's composition lists MgSO4·7H2O and its MgSO4 equivalent; the feed weighs the first).
 */
export function oneFormPerSubstance(ids: string[], components: Map<string, Component>): string[] {
	const chosen = new Map<string, string>();
	for (const id of ids) {
		if (!components.has(id)) continue;
		const substance = substanceIdOf(id, components);
		const held = chosen.get(substance);
		if (held === undefined || (held === substance && id !== substance)) chosen.set(substance, id);
	}
	return [...chosen.values()];
}

export interface SubstanceChoice {
	substanceId: string;
	/** The form offered first: the one the study's recipes use, else the basis form. */
	offeredId: string;
	forms: { id: string; name: string }[];
}

/**
 * The designer's list: each substance once, offered in the form the study's recipes use (feeds first,
 * then the basal medium), else in its basis form, the form the library's solubility is stated for.
 */
export function listSubstanceChoices(components: Component[], studyFormIds: string[]): SubstanceChoice[] {
	const byId = new Map(components.map((c) => [c.id, c]));
	const groups = new Map<string, Component[]>();
	for (const c of components) {
		const substance = substanceIdOf(c.id, byId);
		groups.set(substance, [...(groups.get(substance) ?? []), c]);
	}
	const used = oneFormPerSubstance(studyFormIds, byId);
	return [...groups.entries()]
		.map(([substanceId, forms]) => ({
			substanceId,
			offeredId: used.find((id) => substanceIdOf(id, byId) === substanceId) ?? substanceId,
			forms: forms.map((f) => ({ id: f.id, name: f.name })).sort((a, b) => a.name.localeCompare(b.name))
		}))
		.sort((a, b) => byId.get(a.offeredId)!.name.localeCompare(byId.get(b.offeredId)!.name));
}

function checkCandidates(componentIds: string[], components: Map<string, Component>): Component[] {
	if (componentIds.length === 0) throw new RuleError('Choose at least one component for the feed.', { field: 'componentIds' });
	const firstOfSubstance = new Map<string, number>();
	return componentIds.map((id, i) => {
		const c = components.get(id);
		if (!c) throw new RuleError(`No component “${id}” in the library.`, { field: `componentIds.${i}` });
		const substance = substanceIdOf(id, components);
		const earlier = firstOfSubstance.get(substance);
		if (earlier !== undefined) {
			const other = components.get(componentIds[earlier])!;
			throw new RuleError(
				other.id === c.id
					? `${c.name} is chosen twice; keep it once.`
					: `${c.name} and ${other.name} are two forms of one substance; a feed takes one form of each. Keep one of them.`,
				{ field: `componentIds.${i}` }
			);
		}
		firstOfSubstance.set(substance, i);
		return c;
	});
}

function candidateOf(component: Component, components: Map<string, Component>): FeedCandidate {
	const basis = component.basisComponentId ? components.get(component.basisComponentId) : undefined;
	const basisMolarMass = basis ? molarMassOfComponent(basis) : null;
	return {
		component: componentSpecOf(component),
		basis: basis && basisMolarMass ? { id: basis.id, molarMassGPerMol: basisMolarMass } : null
	};
}

/** The science's field names are the request's, except candidates, which the request names by id. */
function requestField(field: string | undefined): string | undefined {
	if (!field) return undefined;
	const candidate = /^candidates\.(\d+)/.exec(field);
	if (candidate) return `componentIds.${candidate[1]}`;
	return field.startsWith('needs') ? undefined : field;
}

/**
 * Loads what the science needs from a study and a request, and proposes the feed(s): needs are what
 * the basal medium leaves short of safety factor × demand at the final volume.
 */
export function designFeed(inputs: StudyInputs, components: Map<string, Component>, request: FeedDesignRequest): FeedDesign {
	const { plan, vessel } = inputs;
	const maxFeedVolumeL = Math.max(0, vessel.maxWorkingVolumeL - plan.initialVolumeL);
	if (!(request.feedVolumeL > 0)) throw new RuleError('The feed volume must be greater than 0 L.', { field: 'feedVolumeL' });
	if (request.feedVolumeL > maxFeedVolumeL + 1e-9) {
		throw new RuleError(
			`${request.feedVolumeL} L of feed on ${plan.initialVolumeL} L would exceed the vessel's maximum working volume of ${vessel.maxWorkingVolumeL} L; at most ${maxFeedVolumeL} L fits.`,
			{ field: 'feedVolumeL' }
		);
	}
	const chosen = checkCandidates(request.componentIds, components);
	const defaults = defaultFeedLimits(inputs.profile.group);
	const limits = {
		osmolalityMaxMOsmPerKg: request.osmolalityMaxMOsmPerKg ?? defaults.osmolalityMaxMOsmPerKg,
		dissolvedSolidsMaxGPerL: request.dissolvedSolidsMaxGPerL ?? defaults.dissolvedSolidsMaxGPerL
	};
	const usesDefault = request.osmolalityMaxMOsmPerKg === undefined || request.dissolvedSolidsMaxGPerL === undefined;

	const finalVolumeL = plan.initialVolumeL + request.feedVolumeL;
	const { profile, carbon, substrates } = toSufficiencyProfile(inputs.profile);
	const basalOnly = assessSufficiency({
		profile,
		target: plan.targetBasis === 'cellsPerMl' ? { cellsPerMl: plan.targetValue } : { biomassGPerL: plan.targetValue },
		supply: { finalVolumeL, sources: [{ volumeL: plan.initialVolumeL, ...inputs.basal.composition }] },
		safetyFactor: plan.safetyFactor,
		carbon,
		substrates
	});
	const nameOf = (l: SufficiencyLine) => (l.basis === 'element' ? l.key : (inputs.componentNames[l.key] ?? l.key));
	try {
		const result = designFeeds({
			candidates: chosen.map((c) => candidateOf(c, components)),
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
	} catch (cause) {
		if (cause instanceof ChemistryInputError) {
			const field = requestField(cause.field);
			throw new RuleError(cause.message, { field, status: field ? 400 : 422 });
		}
		throw cause;
	}
}
