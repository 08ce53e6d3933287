import solver from 'javascript-lp-solver';
import { assessSufficiency, computeComposition, formulaMolarMass, solubilityAt, type SufficiencyLine } from '$chemistry';
import type { Component } from '../db/schema';
import { componentSpecOf, molarMassOfComponent } from '../components/library';
import { RuleError } from '../rule-error';
import { toSufficiencyProfile } from './profiles';
import type { StudyInputs } from './types';

export interface FeedDesignRequest {
	componentIds: string[];
	feedVolumeL: number;
	temperatureC: number;
}

export interface FeedDesign {
	feasible: boolean;
	feedVolumeL: number;
	temperatureC: number;
	/** Largest feed the vessel holds on top of the initial volume. */
	maxFeedVolumeL: number;
	components: { id: string; name: string; gPerL: number; solubilityGPerL: number | null; atSolubilityLimit: boolean }[];
	coverage: { key: string; name: string; neededGPerLFeed: number; providedGPerLFeed: number; coveredByBasal: boolean }[];
	/** Why it cannot be done, one sentence per nutrient; empty when feasible. */
	problems: string[];
	notes: string[];
}

/** g of each nutrient (element symbol or component id) per g of the component. */
function contentOf(component: Component, components: Map<string, Component>): Record<string, number> {
	const out: Record<string, number> = { [component.id]: 1 };
	const basis = component.basisComponentId ? components.get(component.basisComponentId) : undefined;
	const own = molarMassOfComponent(component);
	const basisMass = basis ? molarMassOfComponent(basis) : null;
	if (basis && own && basisMass) out[basis.id] = basisMass / own;
	const composition = computeComposition({ lines: [{ component: componentSpecOf(component), amount: 1, unit: 'g/L' }], temperatureC: 25 });
	for (const e of composition.elements) if (e.gPerL > 0) out[e.symbol] = e.gPerL;
	return out;
}

/** Solubility of the component itself in g/L at the temperature, when the library has one. */
function solubilityOf(component: Component, temperatureC: number): number | null {
	const spec = component.solubility;
	if (!spec || spec.points.length === 0) return null;
	const limit = solubilityAt(spec.points, temperatureC).gPerL;
	const own = molarMassOfComponent(component);
	if (spec.basisFormula && own) return (limit / formulaMolarMass(spec.basisFormula)) * own;
	return limit;
}

function adviceFor(nutrientName: string, componentName: string): string {
	if (/tyrosine|cystine/i.test(componentName)) return 'use a soluble salt form or a separate alkaline feed';
	return `use a more soluble form of ${nutrientName}, a larger feed volume, or a separate feed`;
}

/**
 * Proposes g/L of each candidate component in one feed concentrate so that basal + feed covers every
 * nutrient at safety factor × demand, by a linear program (least total mass) under each component's
 * solubility at the feed temperature. All coefficients are non-negative and the only other limits are
 * upper bounds, so the design is possible exactly when every nutrient is covered with every component
 * at its solubility: which gives an exact reason per nutrient when it is not.
 */
export function designFeed(inputs: StudyInputs, components: Map<string, Component>, request: FeedDesignRequest): FeedDesign {
	const { plan, vessel } = inputs;
	const maxFeedVolumeL = vessel.maxWorkingVolumeL - plan.initialVolumeL;
	if (!(request.feedVolumeL > 0)) throw new RuleError('The feed volume must be greater than 0 L.', { field: 'feedVolumeL' });
	if (request.feedVolumeL > maxFeedVolumeL + 1e-9) {
		throw new RuleError(
			`${request.feedVolumeL} L of feed on ${plan.initialVolumeL} L would exceed the vessel's maximum working volume of ${vessel.maxWorkingVolumeL} L; at most ${maxFeedVolumeL} L fits.`,
			{ field: 'feedVolumeL' }
		);
	}
	if (request.componentIds.length === 0) throw new RuleError('Choose at least one component for the feed.', { field: 'componentIds' });
	const candidates = request.componentIds.map((id, i) => {
		const c = components.get(id);
		if (!c) throw new RuleError(`No component “${id}” in the library.`, { field: `componentIds.${i}` });
		return { component: c, content: contentOf(c, components), solubility: solubilityOf(c, request.temperatureC) };
	});

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
	const needs = basalOnly.lines.map((l) => ({
		line: l,
		name: nameOf(l),
		neededGPerLFeed: Math.max(0, ((plan.safetyFactor * l.demandGPerL - l.supplyGPerL) * finalVolumeL) / request.feedVolumeL)
	}));

	const variables: Record<string, Record<string, number>> = {};
	const constraints: Record<string, { min?: number; max?: number }> = {};
	candidates.forEach(({ component, content, solubility }, j) => {
		const v: Record<string, number> = { mass: 1 };
		if (solubility !== null) {
			v[`cap${j}`] = 1;
			constraints[`cap${j}`] = { max: solubility };
		}
		needs.forEach((n, i) => {
			const a = content[n.line.key];
			if (a) v[`need${i}`] = a;
		});
		variables[`c${j}`] = v;
	});
	needs.forEach((n, i) => {
		if (n.neededGPerLFeed > 0) constraints[`need${i}`] = { min: n.neededGPerLFeed };
	});

	const problems: string[] = [];
	for (const n of needs) {
		if (n.neededGPerLFeed <= 0) continue;
		const carriers = candidates.filter((c) => c.content[n.line.key]);
		if (carriers.length === 0) {
			problems.push(`No chosen component provides ${n.name}; the feed needs ${n.neededGPerLFeed.toPrecision(3)} g/L of it. Add a component that carries it.`);
			continue;
		}
		if (carriers.some((c) => c.solubility === null)) continue;
		const reachable = carriers.reduce((sum, c) => sum + c.content[n.line.key] * c.solubility!, 0);
		if (reachable + 1e-12 >= n.neededGPerLFeed) continue;
		const main = carriers.reduce((best, c) => (c.content[n.line.key] * c.solubility! > best.content[n.line.key] * best.solubility! ? c : best), carriers[0]);
		const mainNeed = n.neededGPerLFeed / main.content[n.line.key];
		const minimumVolumeL = (n.neededGPerLFeed * request.feedVolumeL) / reachable;
		problems.push(
			`${main.component.name} would need ${mainNeed.toPrecision(2)} g/L, above its solubility of ${main.solubility!.toPrecision(2)} g/L at ${request.temperatureC} °C; ${adviceFor(n.name, main.component.name)}.` +
				(minimumVolumeL > maxFeedVolumeL ? ` Even the largest feed that fits the vessel (${maxFeedVolumeL.toPrecision(3)} L) is too small.` : ` A feed of ${minimumVolumeL.toPrecision(3)} L would dissolve it.`)
		);
	}

	const notes = candidates.filter((c) => c.solubility === null).map((c) => `${c.component.name}: no solubility data in the library, so it is not limited here; check it dissolves.`);
	let amounts = candidates.map(() => 0);
	if (problems.length === 0) {
		const solution = solver.Solve({ optimize: 'mass', opType: 'min', constraints, variables }) as { feasible: boolean; [k: string]: number | boolean | undefined };
		if (!solution.feasible) problems.push('No feed composition meets every demand within the solubility limits.');
		else amounts = candidates.map((_, j) => Number(solution[`c${j}`] ?? 0));
	}
	return {
		feasible: problems.length === 0,
		feedVolumeL: request.feedVolumeL,
		temperatureC: request.temperatureC,
		maxFeedVolumeL,
		components: candidates.map((c, j) => ({
			id: c.component.id,
			name: c.component.name,
			gPerL: amounts[j],
			solubilityGPerL: c.solubility,
			atSolubilityLimit: c.solubility !== null && amounts[j] >= c.solubility * 0.999
		})),
		coverage: needs.map((n) => ({
			key: n.line.key,
			name: n.name,
			neededGPerLFeed: n.neededGPerLFeed,
			providedGPerLFeed: candidates.reduce((sum, c, j) => sum + (c.content[n.line.key] ?? 0) * amounts[j], 0),
			coveredByBasal: n.neededGPerLFeed === 0
		})),
		problems,
		notes
	};
}
