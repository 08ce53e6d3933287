/**
 * Yields of biomass on a substrate worked out from stoichiometry rather than measured.
 *
 * Aerobic growth on one carbon source with ammonia as the nitrogen source,
 *   substrate + NH3 + O2 → biomass + CO2 + H2O,
 * has six rates and four element balances (C, H, O, N): one rate sets the scale and one measured
 * quantity closes the balance (Roels 1983; see `solveStoichiometry`). The measured quantity is
 * either the respiratory quotient (mol CO2 per mol O2) or the yield on oxygen; the balance then
 * gives Yx/s, Yx/O2 and RQ together.
 *
 * A substrate that is the cells' only source of one element (ammonium for N, phosphate for P)
 * gives its yield by that element's balance alone: every atom of the element in new biomass came
 * from it, so Yx/s = w_E(substrate) / w_E(biomass), with w_E the element's mass fraction.
 */
import { ATOMIC_WEIGHTS } from './data/atomic-weights';
import { ChemistryInputError } from './errors';
import { readPositive } from './input';
import { molarMassOf, parseFormula } from './formula';
import { solveStoichiometry } from './stoichiometry';
import { computeDegreeOfReduction } from './degree-of-reduction';

export type GrowthMeasurement =
	| { kind: 'respiratoryQuotient'; molCo2PerMolO2: number }
	| { kind: 'oxygenYield'; gBiomassPerGO2: number }
	/** The yield on the substrate itself: the balance then gives Yx/O2 and RQ. */
	| { kind: 'substrateYield'; gBiomassPerGSubstrate: number };

export interface AerobicGrowthInput {
	substrateFormula: string;
	/** Per C-mol, ash-free, e.g. CH1.8O0.5N0.2. */
	biomassFormula: string;
	/** Ash mass fraction of dry biomass, 0 ≤ a < 1; default 0. */
	ashFraction?: number;
	measured: GrowthMeasurement;
}

export interface AerobicGrowthYields {
	/** g dry biomass per g substrate. */
	biomassOnSubstrateGPerG: number;
	/** g dry biomass per g O2. */
	biomassOnOxygenGPerG: number;
	/** mol CO2 per mol O2. */
	respiratoryQuotient: number;
	/** mol NH3 per mol substrate. */
	ammoniaPerSubstrateMol: number;
	/**
	 * Elasticity of Yx/s to the measurement, (dY/Y)/(dm/m): how many per cent Yx/s moves for 1 % error
	 * in the measured value. RQ on glucose is a weak handle (near RQ 1 almost any yield fits), which
	 * this makes visible.
	 */
	yieldElasticity: number;
}

/** Below this the balance describes combustion, not growth. */
export const MIN_BALANCED_YIELD_G_PER_G = 0.01;
const ELASTICITY_STEP = 0.001;

function scaled(measured: GrowthMeasurement, factor: number): GrowthMeasurement {
	switch (measured.kind) {
		case 'respiratoryQuotient':
			return {
				kind: measured.kind,
				molCo2PerMolO2: measured.molCo2PerMolO2 * factor
			};
		case 'oxygenYield':
			return {
				kind: measured.kind,
				gBiomassPerGO2: measured.gBiomassPerGO2 * factor
			};
		case 'substrateYield':
			return {
				kind: measured.kind,
				gBiomassPerGSubstrate: measured.gBiomassPerGSubstrate * factor
			};
	}
}

/**
 * Yx/s, Yx/O2 and RQ of aerobic growth on one carbon source, from one measured quantity, with the
 * elasticity of Yx/s to that quantity (two more balances; see `balanceAerobicGrowth` without it).
 */
export function solveAerobicGrowth(input: AerobicGrowthInput): AerobicGrowthYields {
	const result = balanceAerobicGrowth(input);
	if (result.biomassOnSubstrateGPerG < MIN_BALANCED_YIELD_G_PER_G) {
		throw new ChemistryInputError(
			`With this measurement the element balance gives almost no growth (Yx/s ${result.biomassOnSubstrateGPerG.toPrecision(2)} g/g, below ${MIN_BALANCED_YIELD_G_PER_G}): the substrate would be burnt, not grown on. Check the value.`,
			{ field: 'measured' }
		);
	}
	let elasticity = Number.NaN;
	try {
		const up = balanceAerobicGrowth({
			...input,
			measured: scaled(input.measured, 1 + ELASTICITY_STEP)
		}).biomassOnSubstrateGPerG;
		const down = balanceAerobicGrowth({
			...input,
			measured: scaled(input.measured, 1 - ELASTICITY_STEP)
		}).biomassOnSubstrateGPerG;
		elasticity = (up - down) / (2 * ELASTICITY_STEP * result.biomassOnSubstrateGPerG);
	} catch (cause) {
		// A neighbour outside the feasible range: the value sits at the edge, where the yield is most sensitive.
		if (!(cause instanceof ChemistryInputError)) throw cause;
		elasticity = Number.POSITIVE_INFINITY;
	}
	return { ...result, yieldElasticity: elasticity };
}

/** The measurement as the stoichiometry solver's specification, and in words for messages. */
function specify(measured: GrowthMeasurement) {
	switch (measured.kind) {
		case 'respiratoryQuotient':
			return {
				what: `an RQ of ${measured.molCo2PerMolO2}`,
				specification: {
					kind: 'molarRatio' as const,
					numerator: 'co2',
					denominator: 'oxygen',
					value: readPositive(
						measured.molCo2PerMolO2,
						'measured.molCo2PerMolO2',
						'The respiratory quotient'
					)
				}
			};
		case 'oxygenYield':
			return {
				what: `a yield on oxygen of ${measured.gBiomassPerGO2} g/g`,
				specification: {
					kind: 'massYield' as const,
					product: 'biomass',
					substrate: 'oxygen',
					gPerG: readPositive(
						measured.gBiomassPerGO2,
						'measured.gBiomassPerGO2',
						'The yield on oxygen'
					)
				}
			};
		case 'substrateYield':
			return {
				what: `a yield on the substrate of ${measured.gBiomassPerGSubstrate} g/g`,
				specification: {
					kind: 'massYield' as const,
					product: 'biomass',
					substrate: 'substrate',
					gPerG: readPositive(
						measured.gBiomassPerGSubstrate,
						'measured.gBiomassPerGSubstrate',
						'The yield on the substrate'
					)
				}
			};
	}
}

/** Yx/s, Yx/O2 and RQ of aerobic growth on one carbon source, from one measured quantity. */
export function balanceAerobicGrowth(
	input: AerobicGrowthInput
): Omit<AerobicGrowthYields, 'yieldElasticity'> {
	const { what, specification } = specify(input.measured);
	let solved: ReturnType<typeof solveStoichiometry>;
	try {
		solved = solveStoichiometry({
			species: [
				{ id: 'substrate', formula: input.substrateFormula, role: 'substrate' },
				{ id: 'ammonia', formula: 'NH3', role: 'nitrogen' },
				{ id: 'oxygen', formula: 'O2', role: 'oxygen' },
				{
					id: 'biomass',
					formula: input.biomassFormula,
					ashFraction: input.ashFraction ?? 0,
					role: 'biomass'
				},
				{ id: 'co2', formula: 'CO2', role: 'carbonDioxide' },
				{ id: 'water', formula: 'H2O', role: 'water' }
			],
			specifications: [{ kind: 'rate', species: 'substrate', mol: -1 }, specification]
		});
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		throw new ChemistryInputError(
			`Aerobic growth on ${input.substrateFormula} cannot have ${what}: ${cause.message}`,
			{ field: 'measured' }
		);
	}
	const { biomassOnSubstrateGPerG, biomassOnOxygenGPerG, respiratoryQuotient } = solved.yields;
	if (
		!(biomassOnSubstrateGPerG! > 0) ||
		!(biomassOnOxygenGPerG! > 0) ||
		!(respiratoryQuotient! > 0)
	) {
		throw new ChemistryInputError(
			'With this measurement the element balance gives no aerobic growth (no biomass formed, or no O2 taken up): check the value and the formulas.',
			{ field: 'measured' }
		);
	}
	return {
		biomassOnSubstrateGPerG: biomassOnSubstrateGPerG!,
		biomassOnOxygenGPerG: biomassOnOxygenGPerG!,
		respiratoryQuotient: respiratoryQuotient!,
		ammoniaPerSubstrateMol: -solved.rates.ammonia.mol
	};
}

export interface SoleSourceInput {
	substrateFormula: string;
	element: string;
	/** g element per g dry biomass (e.g. from the profile's elemental fractions) … */
	biomassElementFraction?: number;
	/** … or worked out from the biomass formula (per C-mol, ash-free) and ash. */
	biomassFormula?: string;
	ashFraction?: number;
}

/** Yx/s of a substrate that is the only source of `element`: w_E(substrate) / w_E(biomass). */
export function computeSoleSourceYield(input: SoleSourceInput): number {
	const { element } = input;
	if (!(element in ATOMIC_WEIGHTS))
		throw new ChemistryInputError(`“${element}” is not an element symbol`, {
			field: 'element'
		});
	const substrate = parseFormula(input.substrateFormula).elements;
	const atoms = substrate[element] ?? 0;
	if (atoms <= 0) {
		throw new ChemistryInputError(
			`${input.substrateFormula} contains no ${element}, so it cannot be the cells' source of it`,
			{ field: 'element' }
		);
	}
	const inSubstrate = (atoms * ATOMIC_WEIGHTS[element]) / molarMassOf(substrate);
	let inBiomass: number;
	if (input.biomassElementFraction !== undefined) {
		inBiomass = readPositive(
			input.biomassElementFraction,
			'biomassElementFraction',
			`The biomass fraction of ${element}`
		);
	} else if (input.biomassFormula !== undefined) {
		const biomass = parseFormula(input.biomassFormula).elements;
		const ash = input.ashFraction ?? 0;
		if (!(ash >= 0 && ash < 1))
			throw new ChemistryInputError(`Ash fraction must be from 0 to below 1, not ${ash}`, {
				field: 'ashFraction'
			});
		inBiomass =
			(((biomass[element] ?? 0) * ATOMIC_WEIGHTS[element]) / molarMassOf(biomass)) * (1 - ash);
		if (!(inBiomass > 0)) {
			throw new ChemistryInputError(
				`The biomass formula ${input.biomassFormula} has no ${element}; give the biomass fraction of ${element} instead`,
				{
					field: 'biomassElementFraction'
				}
			);
		}
	} else {
		throw new ChemistryInputError(
			`The biomass content of ${element} is needed: a fraction or a biomass formula`,
			{ field: 'biomassElementFraction' }
		);
	}
	return inSubstrate / inBiomass;
}

export interface BiomassYieldBound {
	/** The most g dry biomass per g substrate the element balances allow. */
	maxGPerG: number;
	/** Which balance sets it: every substrate carbon into biomass, or every available electron. */
	limitedBy: 'carbon' | 'electrons';
	/** The bound in C-mol biomass per C-mol substrate. */
	maxCmolPerCmol: number;
	substrateGamma: number;
	biomassGamma: number;
	/** Why, in words, for the refusal of a higher yield. */
	reason: string;
}

/**
 * The largest biomass yield on a carbon and energy source that the element balances allow for
 * growth with NH3 as nitrogen source: no CO2 made (all substrate carbon in biomass, 1 C-mol/C-mol)
 * and no O2 taken up (all available electrons in biomass, γs/γx C-mol/C-mol), whichever is lower
 * (Roels 1983; the degree-of-reduction balance as in Doran, Bioprocess Engineering Principles,
 * ch. 4; citations from memory). Null when the substrate has no carbon or no electrons to give.
 */
export function computeMaximumBiomassYield(input: {
	substrateFormula: string;
	/** per C-mol, ash-free, e.g. CH1.8O0.5N0.2 */
	biomassFormula: string;
	ashFraction?: number;
}): BiomassYieldBound | null {
	const substrate = parseFormula(input.substrateFormula).elements;
	const biomass = parseFormula(input.biomassFormula).elements;
	const substrateCarbon = substrate.C ?? 0;
	const biomassCarbon = biomass.C ?? 0;
	if (substrateCarbon <= 0 || biomassCarbon <= 0) return null;
	const substrateGamma = computeDegreeOfReduction(substrate).value;
	const biomassGamma = computeDegreeOfReduction(biomass).value;
	if (!(substrateGamma > 0) || !(biomassGamma > 0)) return null;
	const ash = input.ashFraction ?? 0;
	const substrateGPerCmol = molarMassOf(substrate) / substrateCarbon;
	const biomassGPerCmol = molarMassOf(biomass) / biomassCarbon / (1 - ash);
	const electronBound = substrateGamma / biomassGamma;
	const limitedBy = electronBound < 1 ? 'electrons' : 'carbon';
	const maxCmolPerCmol = Math.min(1, electronBound);
	const maxGPerG = (maxCmolPerCmol * biomassGPerCmol) / substrateGPerCmol;
	const round = (v: number) => Number(v.toPrecision(3));
	const reason =
		limitedBy === 'electrons'
			? `even with no O2 taken up, at most γs/γx = ${round(substrateGamma)}/${round(biomassGamma)} = ${round(maxCmolPerCmol)} C-mol of biomass can form per C-mol of ${input.substrateFormula} (degree-of-reduction balance, NH3 as nitrogen source)`
			: `even with no CO2 given off, at most 1 C-mol of biomass can form per C-mol of ${input.substrateFormula} (carbon balance)`;
	return { maxGPerG, limitedBy, maxCmolPerCmol, substrateGamma, biomassGamma, reason };
}
