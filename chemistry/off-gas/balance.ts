/**
 * Oxygen uptake (OUR), carbon dioxide evolution (CER) and the respiratory quotient from an off-gas
 * measurement, by the inert-gas (N2) balance: the inert gas passes the culture unchanged, so the
 * outlet flow follows from the inlet flow and the two inert fractions, F_out = F_in·y_I,in/y_I,out,
 * with y_I = 1 − y_O2 − y_CO2 on a dry basis. Then OUR = (F_in·y_O2,in − F_out·y_O2,out)/V and
 * CER = (F_out·y_CO2,out − F_in·y_CO2,in)/V. This is the standard balance of the textbooks (e.g.
 * Doran, Bioprocess Engineering Principles; Villadsen, Nielsen & Lidén, Bioreaction Engineering
 * Principles; citation from memory).
 */
import { ChemistryInputError } from '../errors';
import { isGiven, readBetween, readPositive } from '../input';
import { inSentence } from '../field-labels';
import { readInletGasFlow, type InletGasFlowInput } from './gas-flow';

export * from './gas-flow';
export * from './in-situ-kla';
export * from './cumulative';

/**
 * The largest change of the inert fraction between inlet and outlet that the balance accepts, as a
 * fraction (0.10 = 10 percentage points). Air-sparged cultures move it by well under one point; a
 * larger change means a fraction typed in % instead of a fraction, swapped inlet and outlet, a wet
 * outlet analysis or a gas other than O2 and CO2 exchanged, and the balance would then mislead.
 * Our plausibility bound, not a published value; callers with enriched gas may widen it.
 */
export const MAX_INERT_FRACTION_CHANGE = 0.1;

const MMOL_PER_MOL = 1000;

export interface OffGasMeasurement extends InletGasFlowInput {
	inletO2Fraction: number;
	inletCo2Fraction: number;
	/** dry basis */
	outletO2Fraction: number;
	/** dry basis */
	outletCo2Fraction: number;
	liquidVolumeL: number;
	/** default MAX_INERT_FRACTION_CHANGE */
	maxInertFractionChange?: number | null;
}

export interface OffGasRates {
	inletFlowMolPerH: number;
	outletFlowMolPerH: number;
	/** null when the inlet flow was given in mol/h */
	molarVolumeLPerMol: number | null;
	inletInertFraction: number;
	outletInertFraction: number;
	ourMmolPerLH: number;
	cerMmolPerLH: number;
	/** CER/OUR; null when OUR is not positive (no uptake to divide by) */
	respiratoryQuotient: number | null;
}

const LABELS = {
	inletO2Fraction: 'Inlet O₂ fraction',
	inletCo2Fraction: 'Inlet CO₂ fraction',
	outletO2Fraction: 'Outlet O₂ fraction',
	outletCo2Fraction: 'Outlet CO₂ fraction',
	liquidVolumeL: 'Liquid volume',
	maxInertFractionChange: 'Largest inert-fraction change'
} as const;

function readFraction(value: unknown, field: keyof typeof LABELS): number {
	return readBetween(value, field, 0, 1, `${LABELS[field]} (a mole fraction, not %)`);
}

interface InertFractions {
	inlet: number;
	outlet: number;
	outletO2: number;
	outletCo2: number;
}

function readInertFractions(m: OffGasMeasurement, yO2In: number, yCo2In: number): InertFractions {
	const yO2Out = readFraction(m.outletO2Fraction, 'outletO2Fraction');
	const yCo2Out = readFraction(m.outletCo2Fraction, 'outletCo2Fraction');
	const inlet = 1 - yO2In - yCo2In;
	const outlet = 1 - yO2Out - yCo2Out;
	if (inlet < 0) {
		throw new ChemistryInputError(
			`${LABELS.inletO2Fraction} and ${inSentence(LABELS.inletCo2Fraction)} add up to ${yO2In + yCo2In}, more than 1.`,
			{ field: 'inletCo2Fraction' }
		);
	}
	if (outlet < 0) {
		throw new ChemistryInputError(
			`${LABELS.outletO2Fraction} and ${inSentence(LABELS.outletCo2Fraction)} add up to ${yO2Out + yCo2Out}, more than 1.`,
			{ field: 'outletCo2Fraction' }
		);
	}
	if (inlet === 0 || outlet === 0) {
		throw new ChemistryInputError(
			'The inert-gas balance needs inert gas (N₂) in both inlet and outlet; with O₂ and CO₂ adding up to 1 the outlet flow cannot be found this way.',
			{ field: inlet === 0 ? 'inletO2Fraction' : 'outletO2Fraction' }
		);
	}
	return { inlet, outlet, outletO2: yO2Out, outletCo2: yCo2Out };
}

function checkInertChange(inert: InertFractions, maxChange: number): void {
	const change = Math.abs(inert.outlet - inert.inlet);
	if (change > maxChange) {
		const points = (x: number) => `${+(x * 100).toPrecision(4)} percentage points`;
		throw new ChemistryInputError(
			`The inert fraction changes from ${+inert.inlet.toPrecision(6)} at the inlet to ${+inert.outlet.toPrecision(6)} at the outlet, by ${points(change)}, more than ${points(maxChange)}. ` +
				'A culture exchanges only O₂ and CO₂, so the inert fraction moves little; check that the outlet fractions are dry-basis mole fractions (not %), and that inlet and outlet are not swapped.',
			{ field: 'outletO2Fraction' }
		);
	}
}

/** OUR, CER and RQ of one off-gas measurement by the inert-gas balance. */
export function computeOffGasRates(measurement: OffGasMeasurement): OffGasRates {
	const flow = readInletGasFlow(measurement);
	const yO2In = readFraction(measurement.inletO2Fraction, 'inletO2Fraction');
	const yCo2In = readFraction(measurement.inletCo2Fraction, 'inletCo2Fraction');
	const inert = readInertFractions(measurement, yO2In, yCo2In);
	const maxChange = !isGiven(measurement.maxInertFractionChange)
		? MAX_INERT_FRACTION_CHANGE
		: readBetween(
				measurement.maxInertFractionChange,
				'maxInertFractionChange',
				0,
				1,
				LABELS.maxInertFractionChange
			);
	checkInertChange(inert, maxChange);
	const volumeL = readPositive(measurement.liquidVolumeL, 'liquidVolumeL', LABELS.liquidVolumeL);

	const inletMolPerH = flow.molPerH;
	const outletMolPerH = (inletMolPerH * inert.inlet) / inert.outlet;
	const o2UptakeMolPerH = inletMolPerH * yO2In - outletMolPerH * inert.outletO2;
	const co2EvolutionMolPerH = outletMolPerH * inert.outletCo2 - inletMolPerH * yCo2In;
	const ourMmolPerLH = (o2UptakeMolPerH * MMOL_PER_MOL) / volumeL;
	const cerMmolPerLH = (co2EvolutionMolPerH * MMOL_PER_MOL) / volumeL;
	return {
		inletFlowMolPerH: inletMolPerH,
		outletFlowMolPerH: outletMolPerH,
		molarVolumeLPerMol: flow.molarVolumeLPerMol,
		inletInertFraction: inert.inlet,
		outletInertFraction: inert.outlet,
		ourMmolPerLH,
		cerMmolPerLH,
		respiratoryQuotient: ourMmolPerLH > 0 ? cerMmolPerLH / ourMmolPerLH : null
	};
}
