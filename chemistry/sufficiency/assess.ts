/**
 * Nutrient sufficiency: can a medium (plus feeds) support a target biomass?
 *
 * For every requirement line (an element or a component) demand = target biomass × requirement per
 * g of dry biomass (or target cells × per-cell consumption); supply is what the sources deliver per
 * litre of final volume. ratio = supply / demand; the line is sufficient when ratio ≥ safety factor,
 * and the biomass it could support is target × ratio / safety factor — the minimum over lines is the
 * maximum supportable biomass and names the limiting nutrient (Liebig's law of the minimum, as used
 * for medium design, e.g. Stanbury, Whitaker & Hall, Principles of Fermentation Technology — citation
 * from memory). The default safety factor 1.2 is common practice.
 *
 * Carbon is special: most substrate carbon is respired to CO2, not built into cells. With a yield on
 * the carbon source the carbon line becomes demand = X / Yx/s (on that component, or on element C),
 * which includes the respired carbon; without one, the element-C line counts only carbon in biomass
 * (X · f_C), a lower bound, and says so.
 *
 * H and O are left out by default: cells take them from water and O2, not from the dissolved medium.
 *
 * Not every element of a measured cell composition is a requirement. Each line has a role
 * (data/element-roles.ts, common practice, or the profile's own): only 'required' lines (C, N, P,
 * S, K, Mg, the carbon source, further substrates and component demands) name the limit and the
 * maximum supportable biomass; a 'trace' line (Fe, Ca, Zn, Na, Cl ...) that runs short is a warning
 * naming the element. Each line also says how sure its composition value is, and where it comes from.
 */
import { DEFAULT_ELEMENT_ROLES_BASIS } from '../data/element-roles';
import { readFinite, readPositive } from '../input';
import { VALUE_CONFIDENCE_WORDS, formatPercentOfDryMass } from '../profile-elements';
import {
	type SufficiencyInput,
	type Requirement,
	type SufficiencyLine,
	type Supply,
	type SufficiencyResult,
	DEFAULT_SAFETY_FACTOR,
	DEFAULT_IGNORED_ELEMENTS,
	type Target
} from './types';
import {
	fail,
	requireElement,
	readSupply,
	readTarget,
	resolveProfile,
	checkProfileFormula
} from './read';
import { buildRequirements, applyCarbon, applySubstrates } from './requirements';
export {
	type SupplyBasis,
	type PerCellConsumption,
	type ElementStatements,
	type OrganismProfile,
	type SufficiencyTarget,
	type SupplySource,
	type SupplyInput,
	type CarbonDemand,
	type SufficiencyInput,
	type SubstrateDemand,
	type SufficiencyLine,
	type SufficiencyResult,
	DEFAULT_SAFETY_FACTOR,
	DEFAULT_IGNORED_ELEMENTS
} from './types';

/**
 * Assess a supply against a target biomass for an organism profile. See the module comment for the
 * rules; every demand, supply and margin is in g per litre of final volume.
 */
export function assessSufficiency(input: SufficiencyInput): SufficiencyResult {
	if (input === null || typeof input !== 'object') fail('Sufficiency input must be an object');
	const safetyFactor =
		input.safetyFactor === undefined
			? DEFAULT_SAFETY_FACTOR
			: readFinite(input.safetyFactor, 'safetyFactor', 'Safety factor');
	if (safetyFactor < 1)
		fail(`Safety factor must be at least 1, not ${safetyFactor}`, 'safetyFactor');
	const ignoredList = input.ignoreElements ?? [...DEFAULT_IGNORED_ELEMENTS];
	if (!Array.isArray(ignoredList))
		fail('ignoreElements must be a list of element symbols', 'ignoreElements');
	ignoredList.forEach((el, i) => requireElement(el, `ignoreElements.${i}`));
	const ignored = new Set(ignoredList);

	const profile = resolveProfile(input.profile);
	const profileDryMassPg =
		profile.cellDryMassPg === undefined
			? null
			: readPositive(profile.cellDryMassPg, 'profile.cellDryMassPg', 'Cell dry mass');
	const target = readTarget(input.target, profileDryMassPg);
	const supply = readSupply(input.supply);
	const notes: string[] = [];
	const requirements = applyCarbon(
		buildRequirements(profile, target, ignored),
		input.carbon,
		profile,
		target,
		notes
	);
	const withSubstrates = applySubstrates(requirements, input.substrates, target);
	if (withSubstrates.length === 0) fail('The profile has no requirement to assess', 'profile');

	const lines = withSubstrates.map((r) => compareWithSupply(r, supply, target, safetyFactor));
	const required = lines.filter((l) => l.role === 'required');
	if (required.length === 0) {
		fail(
			`Every line of this profile (${lines.map((l) => l.key).join(', ')}) is a trace element, and trace elements never set the limit: mark at least one as required, or give a yield on the carbon source`,
			'profile'
		);
	}
	let limiting = required[0];
	for (const line of required) if (line.ratio < limiting.ratio) limiting = line;
	const warnings = [
		...checkProfileFormula(profile),
		...lines
			.filter((l) => l.role === 'trace' && !l.sufficient)
			.map((l) => describeShortTrace(l, target, safetyFactor))
	];
	return {
		target,
		safetyFactor,
		finalVolumeL: supply.finalVolumeL,
		lines,
		limiting: { key: limiting.key, basis: limiting.basis, ratio: limiting.ratio },
		maximumSupportable: {
			biomassGPerL: limiting.maxBiomassGPerL,
			cellsPerMl: limiting.maxCellsPerMl
		},
		sufficient: required.every((l) => l.sufficient),
		warnings,
		notes,
		defaultRolesBasis: DEFAULT_ELEMENT_ROLES_BASIS
	};
}

const significant = (value: number) => String(Number(value.toPrecision(3)));

/** A trace line short of safety factor × demand, in one sentence that names it and what it would allow. */
function describeShortTrace(line: SufficiencyLine, target: Target, safetyFactor: number): string {
	const share =
		target.biomassGPerL === null
			? `${significant(line.demandGPerL)} g/L at the target`
			: `${formatPercentOfDryMass(line.demandGPerL / target.biomassGPerL)} % of dry mass`;
	const value = `${share}, ${VALUE_CONFIDENCE_WORDS[line.confidence]}`;
	const advice =
		'a trace element does not set the limit; check that the water, the salts or a trace-element solution carry enough of it for this organism.';
	if (line.supplyGPerL === 0)
		return `${line.key} is in no source (the profile counts it at ${value}): ${advice}`;
	const allows =
		line.maxBiomassGPerL === null
			? ''
			: `, enough for about ${significant(line.maxBiomassGPerL)} g/L at safety factor ${safetyFactor}`;
	return `${line.key} covers ${significant(line.ratio)} × its demand (the profile counts it at ${value})${allows}: ${advice}`;
}

/** One requirement against what the supply gives: ratio, margin and the biomass it would support. */
function compareWithSupply(
	r: Requirement,
	supply: Supply,
	target: Target,
	safetyFactor: number
): SufficiencyLine {
	const supplyGPerL = (r.basis === 'element' ? supply.element : supply.component).get(r.key) ?? 0;
	const ratio = supplyGPerL / r.demandGPerL;
	const line: SufficiencyLine = {
		key: r.key,
		basis: r.basis,
		demandGPerL: r.demandGPerL,
		supplyGPerL,
		demandMmolPerL: r.molarMassGPerMol ? (r.demandGPerL / r.molarMassGPerMol) * 1000 : null,
		supplyMmolPerL: r.molarMassGPerMol ? (supplyGPerL / r.molarMassGPerMol) * 1000 : null,
		ratio,
		marginGPerL: supplyGPerL - safetyFactor * r.demandGPerL,
		sufficient: ratio >= safetyFactor,
		maxBiomassGPerL:
			target.biomassGPerL === null ? null : (target.biomassGPerL * ratio) / safetyFactor,
		maxCellsPerMl: target.cellsPerMl === null ? null : (target.cellsPerMl * ratio) / safetyFactor,
		role: r.role,
		roleFrom: r.roleFrom,
		confidence: r.confidence,
		source: r.source
	};
	if (r.note) line.note = r.note;
	if (supplyGPerL === 0)
		line.note = [line.note, 'Not supplied by any source.'].filter(Boolean).join(' ');
	return line;
}
