/**
 * kLa measured in a running culture: at steady dissolved oxygen the transfer matches the uptake,
 * kLa·(C* − C) = OUR (film theory, Lewis & Whitman 1924; from memory), so kLa = OUR/(C* − C).
 */
import { ChemistryInputError } from '../errors';
import { readNonNegative, readPositive } from '../input';
import { O2_MOLAR_MASS_G_PER_MOL } from '../oxygen-saturation';

export type OxygenConcentrationUnit = 'mmol/L' | 'mg/L';

export interface InSituKlaInput {
	ourMmolPerLH: number;
	/** C*, in `concentrationUnit` */
	saturationConcentration: number;
	/** C, the measured dissolved O2, in `concentrationUnit` */
	dissolvedConcentration: number;
	concentrationUnit: OxygenConcentrationUnit;
}

export interface InSituKla {
	kLaPerH: number;
	/** C* − C in mmol/L */
	drivingForceMmolPerL: number;
}

function toMmolPerL(value: number, unit: OxygenConcentrationUnit): number {
	return unit === 'mg/L' ? value / O2_MOLAR_MASS_G_PER_MOL : value;
}

export function computeInSituKla(input: InSituKlaInput): InSituKla {
	const unit = input.concentrationUnit;
	if (unit !== 'mmol/L' && unit !== 'mg/L') {
		throw new ChemistryInputError(
			`Dissolved-oxygen unit must be mmol/L or mg/L, not ${String(unit)}`,
			{ field: 'concentrationUnit' }
		);
	}
	const our = readPositive(input.ourMmolPerLH, 'ourMmolPerLH', 'OUR');
	const saturation = readPositive(
		input.saturationConcentration,
		'saturationConcentration',
		'DO saturation C*'
	);
	const dissolved = readNonNegative(input.dissolvedConcentration, 'dissolvedConcentration', 'DO');
	if (dissolved >= saturation) {
		throw new ChemistryInputError(
			`DO (${dissolved} ${unit}) must be below DO saturation C* (${saturation} ${unit}): with no driving force C* − C the uptake cannot be supplied by transfer, so kLa cannot be read from it.`,
			{ field: 'dissolvedConcentration' }
		);
	}
	const drivingForceMmolPerL = toMmolPerL(saturation - dissolved, unit);
	return { kLaPerH: our / drivingForceMmolPerL, drivingForceMmolPerL };
}
