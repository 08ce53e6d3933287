/**
 * Black-box growth stoichiometry by element balances (Roels 1983; Heijnen, in Smolke (ed.) The
 * Metabolic Pathway Engineering Handbook — citations from memory).
 *
 * Each species j has a rate r_j (mol; C-mol for biomass; consumed negative, produced positive). The
 * balanced elements give E·r = 0 (E: atoms per unit, elements × species). Each specification adds one
 * linear row s·r = b: a rate fixes r_j; a mass yield |r_p|·M_p = Y·|r_s|·M_s and a molar ratio
 * |r_n| = v·|r_d| become linear once each species' direction is known (from its role, otherwise found
 * by re-solving). The combined system [E; S]·r = [0; b] is solved by writing r = N·z with N an
 * orthonormal null-space basis of E (SVD), so the element balances hold exactly and only S·N·z = b is
 * solved — exactly when determined, by weighted least squares when specifications are redundant.
 *
 * Degrees of freedom = #species − rank(E); redundancy = #specifications − (their independent count).
 * With redundancy, consistency is judged by h = Σ (δ_i/σ_i)², δ_i the relative deviation of
 * specification i from its given value at the least-squares solution and σ_i its relative standard
 * error, against the χ² quantile with `redundancy` degrees of freedom (the test of Wang &
 * Stephanopoulos 1983, Biotechnol. Bioeng. 25:2177, and van der Heijden et al. 1994, Biotechnol.
 * Bioeng. 43:3 — citations from memory).
 */
import type { Matrix } from 'ml-matrix';
import { computeDegreeOfReduction } from '../degree-of-reduction';
import { ChemistryInputError } from '../errors';
import {
	type SpeciesRole,
	type StoichiometryInput,
	type SpeciesRate,
	type StoichiometryYields,
	type StoichiometryResult,
	type ElectronBalance,
	type Species,
	type Spec,
	CONSUMED,
	PRODUCED
} from './types';
import { readSpecies, readElements, readSpecifications } from './read';
import { buildRows, columns, decompose, joinOr, solveReduced, type Solved } from './algebra';
import { assessConsistency } from './consistency';
export {
	type SpeciesRole,
	type StoichiometrySpecies,
	type StoichiometrySpecification,
	type StoichiometryInput,
	type SpeciesRate,
	type StoichiometryYields,
	type ElectronBalance,
	type SpecificationDeviation,
	type StoichiometryConsistency,
	type StoichiometryResult,
	DEFAULT_BALANCE_ELEMENTS,
	DEFAULT_RELATIVE_ERROR
} from './types';

function expectedSign(s: Species): number {
	if (s.role && CONSUMED.has(s.role)) return -1;
	return 1;
}

function isFixedDirection(s: Species): boolean {
	return s.role !== undefined && (CONSUMED.has(s.role) || PRODUCED.has(s.role));
}

/**
 * Solves the growth stoichiometry. Rates: consumed negative, produced positive; biomass per C-mol.
 * Throws ChemistryInputError when under-specified (saying how many more and on which species),
 * when a species' solved direction contradicts its role, or on malformed input.
 */
export function solveStoichiometry(input: StoichiometryInput): StoichiometryResult {
	if (input === null || typeof input !== 'object') {
		throw new ChemistryInputError(
			'Stoichiometry input must be an object with species and specifications'
		);
	}
	const species = readSpecies(input.species);
	const n = species.length;
	const elements = readElements(input.elements, species);
	const byId = new Map(species.map((s) => [s.id, s]));
	const specs = readSpecifications(input.specifications, byId);
	const confidence = readConsistencyConfidence(input.consistencyConfidence);
	const molarMasses = species.map((s) => s.molarMass);

	const elementMatrix = elements.map((el) => species.map((s) => s.elements[el] ?? 0));
	const eDec = decompose(elementMatrix, n);
	const degreesOfFreedom = n - eDec.rank;
	if (degreesOfFreedom === 0) {
		throw new ChemistryInputError(
			`The element balances alone force every rate to 0 (${n} species, ${eDec.rank} independent balances): add the species that close the balance, e.g. CO2 or H2O`,
			{ field: 'species' }
		);
	}
	const nullBasis = columns(eDec.v, eDec.rank, n);
	const solved = solveWithDirections(species, specs, nullBasis, molarMasses);
	const rates = solved.rates;
	const maxRate = Math.max(...rates.map(Math.abs));
	checkFixedDirections(species, rates, maxRate);

	const { ratesOut, molarMassesOut, roles } = describeRates(species, rates, maxRate);
	const { degreesOfReduction, electronBalance } = computeElectronBalance(
		species,
		elements,
		rates,
		roles
	);
	const elementResiduals: Record<string, number> = {};
	elements.forEach((el, i) => {
		elementResiduals[el] = elementMatrix[i].reduce((acc, c, j) => acc + c * rates[j], 0);
	});

	const redundancy = specs.length - solved.rankM;
	const result: StoichiometryResult = {
		elements,
		rates: ratesOut,
		roles,
		molarMasses: molarMassesOut,
		yields: computeYields(species, rates, roles),
		degreesOfReduction,
		electronBalance,
		elementResiduals,
		degreesOfFreedom,
		redundancy,
		independentSpecifications: solved.rankM,
		notes: noteUnbalancedElements(species, elements)
	};
	if (redundancy > 0)
		result.consistency = assessConsistency(specs, rates, molarMasses, redundancy, confidence);
	return result;
}

function readConsistencyConfidence(value: unknown): number {
	const confidence = value ?? 0.95;
	if (typeof confidence !== 'number' || !(confidence > 0 && confidence < 1)) {
		throw new ChemistryInputError('Consistency confidence must be between 0 and 1, e.g. 0.95', {
			field: 'consistencyConfidence'
		});
	}
	return confidence;
}

/**
 * Directions: fixed by role where it has one; otherwise guessed (a rate specification gives its own
 * sign) and corrected by re-solving until no free species comes out against its assumed direction.
 */
function solveWithDirections(
	species: Species[],
	specs: Spec[],
	nullBasis: Matrix,
	molarMasses: number[]
): Solved {
	const n = species.length;
	const signs = species.map(expectedSign);
	for (const spec of specs) {
		if (spec.kind === 'rate' && spec.value !== 0 && !isFixedDirection(species[spec.a])) {
			signs[spec.a] = Math.sign(spec.value);
		}
	}
	const tried = new Set<string>();
	for (let attempt = 0; attempt < 2 * n + 2; attempt++) {
		tried.add(signs.join(','));
		const solved = solveReduced(
			buildRows(specs, signs, molarMasses, n),
			specs,
			nullBasis,
			species,
			molarMasses
		);
		const maxRate = Math.max(...solved.rates.map(Math.abs));
		const flips = new Set<number>();
		for (const spec of specs) {
			if (spec.kind === 'rate') continue;
			for (const j of [spec.a, spec.b]) {
				if (!isFixedDirection(species[j]) && signs[j] * solved.rates[j] < -1e-9 * maxRate)
					flips.add(j);
			}
		}
		if (flips.size === 0) return solved;
		for (const j of flips) signs[j] = -signs[j];
		if (tried.has(signs.join(','))) {
			throw new ChemistryInputError(
				`No consistent direction found for ${joinOr(
					[...flips].map((j) => `'${species[j].id}'`),
					'and'
				)}: the yields and ratios given cannot all hold. Give the species a role or check the values`,
				{ field: 'specifications' }
			);
		}
	}
	throw new ChemistryInputError(
		'The yields and ratios given cannot all hold with consistent directions',
		{
			field: 'specifications'
		}
	);
}

/** A species whose role fixes its direction must come out that way. */
function checkFixedDirections(species: Species[], rates: number[], maxRate: number): void {
	for (const s of species) {
		if (!isFixedDirection(s) || !s.role) continue;
		const r = rates[s.index];
		const wrong = CONSUMED.has(s.role) ? r > 1e-9 * maxRate : r < -1e-9 * maxRate;
		if (wrong) {
			const came = r > 0 ? 'produced' : 'consumed';
			const should = CONSUMED.has(s.role) ? 'consumed' : 'produced';
			const hint =
				s.role === 'oxygen'
					? ' (a biomass or product yield above what the substrate electrons allow makes O2 come out produced)'
					: '';
			throw new ChemistryInputError(
				`With these specifications '${s.id}' comes out ${came} (${formatNumber(r)} mol), but as ${s.role} it must be ${should}${hint}. Check the values, or give '${s.id}' the role that matches`,
				{ field: 'specifications' }
			);
		}
	}
}

function noteUnbalancedElements(species: Species[], elements: string[]): string[] {
	const notes: string[] = [];
	for (const s of species) {
		const unbalanced = Object.keys(s.elements).filter((el) => !elements.includes(el));
		if (unbalanced.length > 0) {
			notes.push(
				`'${s.id}' contains ${unbalanced.join(', ')}, which ${unbalanced.length === 1 ? 'is' : 'are'} not balanced`
			);
		}
	}
	return notes;
}

function describeRates(species: Species[], rates: number[], maxRate: number) {
	const ratesOut: Record<string, SpeciesRate> = {};
	const molarMassesOut: Record<string, number> = {};
	const roles: Record<string, SpeciesRole | null> = {};
	for (const s of species) {
		const r = rates[s.index];
		ratesOut[s.id] = { mol: r, g: r * s.molarMass, cmol: s.carbon > 0 ? r * s.carbon : null };
		molarMassesOut[s.id] = s.molarMass;
		roles[s.id] = s.role ?? resolveRole(s, r, maxRate);
	}
	return { ratesOut, molarMassesOut, roles };
}

/** Degrees of reduction and the electron balance Σ γ·r, with where the substrates' electrons go. */
function computeElectronBalance(
	species: Species[],
	elements: string[],
	rates: number[],
	roles: Record<string, SpeciesRole | null>
): { degreesOfReduction: Record<string, number>; electronBalance: ElectronBalance } {
	const balanced = Object.fromEntries(elements.map((el) => [el, 1]));
	const degreesOfReduction: Record<string, number> = {};
	const terms: Record<string, number> = {};
	const gammaPerUnit: number[] = [];
	for (const s of species) {
		// γ over the balanced elements only, so Σ γ·r follows from the element balances.
		const counted = Object.fromEntries(Object.entries(s.elements).filter(([el]) => el in balanced));
		const dor = computeDegreeOfReduction(counted, { field: `species.${s.index}.formula` });
		degreesOfReduction[s.id] = dor.value;
		gammaPerUnit.push(dor.perMol);
		terms[s.id] = dor.perMol * rates[s.index];
	}
	const termValues = Object.values(terms);
	const sum = termValues.reduce((acc, t) => acc + t, 0);
	const total = termValues.reduce((acc, t) => acc + Math.abs(t), 0);
	const substrates = species.filter((s) => roles[s.id] === 'substrate' && rates[s.index] < 0);
	const available = substrates.reduce((acc, s) => acc - gammaPerUnit[s.index] * rates[s.index], 0);
	const fractions: Record<string, number> = {};
	if (available > 0) {
		for (const s of species) {
			if (substrates.includes(s) || terms[s.id] === 0) continue;
			fractions[s.id] = terms[s.id] / available;
		}
	}
	const relativeResidual = total > 0 ? Math.abs(sum) / total : 0;
	return {
		degreesOfReduction,
		electronBalance: {
			terms,
			sum,
			relativeResidual,
			closes: relativeResidual < 1e-9,
			availableFromSubstratesMol: available,
			fractions
		}
	};
}

function formatNumber(value: number): string {
	return Number(value.toPrecision(4)).toString();
}

function resolveRole(s: Species, rate: number, maxRate: number): SpeciesRole | null {
	if (Math.abs(rate) <= 1e-12 * maxRate) return null;
	if (rate < 0)
		return s.carbon > 0 ? 'substrate' : (s.elements.N ?? 0) > 0 ? 'nitrogen' : 'substrate';
	return 'product';
}

function computeYields(
	species: Species[],
	rates: number[],
	roles: Record<string, SpeciesRole | null>
): StoichiometryYields {
	const biomass = species.find((s) => roles[s.id] === 'biomass');
	const oxygen = species.find((s) => roles[s.id] === 'oxygen');
	const co2 = species.find((s) => roles[s.id] === 'carbonDioxide');
	const substrates = species.filter((s) => roles[s.id] === 'substrate' && rates[s.index] < 0);
	const products = species.filter((s) => roles[s.id] === 'product' && rates[s.index] > 0);
	const grams = (s: Species) => Math.abs(rates[s.index]) * s.molarMass;
	const biomassG = biomass ? rates[biomass.index] * biomass.molarMass : null;
	const biomassCmol = biomass ? rates[biomass.index] : null;
	const perSubstrate: StoichiometryYields['perSubstrate'] = {};
	for (const s of substrates) {
		perSubstrate[s.id] = {
			biomassGPerG: biomassG === null ? null : biomassG / grams(s),
			biomassCmolPerCmol:
				biomassCmol === null || s.carbon === 0
					? null
					: biomassCmol / (Math.abs(rates[s.index]) * s.carbon),
			productsGPerG: Object.fromEntries(products.map((p) => [p.id, grams(p) / grams(s)]))
		};
	}
	const first = substrates[0];
	const oxygenConsumedG = oxygen && rates[oxygen.index] < 0 ? grams(oxygen) : 0;
	return {
		firstSubstrate: first ? first.id : null,
		biomassOnSubstrateGPerG: first ? perSubstrate[first.id].biomassGPerG : null,
		biomassOnSubstrateCmolPerCmol: first ? perSubstrate[first.id].biomassCmolPerCmol : null,
		perSubstrate,
		biomassOnOxygenGPerG:
			biomassG !== null && oxygenConsumedG > 0 ? biomassG / oxygenConsumedG : null,
		oxygenPerBiomassGPerG:
			biomassG !== null && biomassG > 0 && oxygen ? oxygenConsumedG / biomassG : null,
		respiratoryQuotient:
			co2 && oxygen && rates[oxygen.index] < 0 ? rates[co2.index] / -rates[oxygen.index] : null
	};
}
