import {
	ChemistryInputError,
	StudyDataError,
	designStudyFeed,
	requireFeedVolumeFits,
	type FeedCandidate,
	type FeedDesign,
	type FeedDesignRequest
} from '$chemistry';
import type { Component } from '../db/schema';
import { componentSpecOf, molarMassOfComponent } from '../components/library';
import { RuleError } from '../rule-error';
import type { StudyInputs } from './types';

// The feed designer's model (needs, limits, the LP) is chemistry/study/feed-designer.ts; here the library is looked up.
export {
	defaultFeedLimits,
	type DefaultFeedLimits,
	type FeedDesign,
	type FeedDesignRequest
} from '$chemistry';

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
export function listSubstanceChoices(
	components: Component[],
	studyFormIds: string[]
): SubstanceChoice[] {
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
			forms: forms
				.map((f) => ({ id: f.id, name: f.name }))
				.sort((a, b) => a.name.localeCompare(b.name))
		}))
		.sort((a, b) => byId.get(a.offeredId)!.name.localeCompare(byId.get(b.offeredId)!.name));
}

function checkCandidates(componentIds: string[], components: Map<string, Component>): Component[] {
	if (componentIds.length === 0)
		throw new RuleError('Choose at least one component for the feed.', { field: 'componentIds' });
	const firstOfSubstance = new Map<string, number>();
	return componentIds.map((id, i) => {
		const c = components.get(id);
		if (!c)
			throw new RuleError(`No component “${id}” in the library.`, { field: `componentIds.${i}` });
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
 * Looks up the chosen components and proposes the feed(s) (`designStudyFeed`); the science's fields
 * are the request's, except candidates, which the request names by id.
 */
export function designFeed(
	inputs: StudyInputs,
	components: Map<string, Component>,
	request: FeedDesignRequest
): FeedDesign {
	try {
		requireFeedVolumeFits(inputs, request.feedVolumeL);
		const chosen = checkCandidates(request.componentIds, components);
		return designStudyFeed(
			inputs,
			chosen.map((c) => candidateOf(c, components)),
			request
		);
	} catch (cause) {
		if (cause instanceof StudyDataError)
			throw new RuleError(cause.message, { field: cause.field, status: 422 });
		if (cause instanceof ChemistryInputError) {
			const field = requestField(cause.field);
			throw new RuleError(cause.message, { field, status: field ? 400 : 422 });
		}
		throw cause;
	}
}
