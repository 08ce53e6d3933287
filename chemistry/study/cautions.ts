import { AIR_O2_MOLE_FRACTION } from '../data/oxygen-solubility';

/** Mole fractions closer than this to air's are air. */
export const AIR_FRACTION_TOLERANCE = 1e-4;

/** Inlet gas richer in O2 than air: what brings the fire risk of enrichment. */
export function isOxygenEnriched(o2MoleFraction: number): boolean {
	return o2MoleFraction > AIR_O2_MOLE_FRACTION + AIR_FRACTION_TOLERANCE;
}

export const OXYGEN_ENRICHMENT_CAUTION =
	'Oxygen-enriched gas raises the risk of fire: keep ignition sources and oils away, and use only equipment rated for the O2 fraction.';

/** Every caution a study can carry; `studyCautions` picks those that apply. */
export const STUDY_CAUTIONS = [
	OXYGEN_ENRICHMENT_CAUTION,
	"Stay within the vessel's pressure rating; do not raise headspace pressure beyond it to gain oxygen transfer.",
	'These results are estimates from models and typical values, not measurements.',
	"The site's procedures and qualified engineers decide whether and how a run goes ahead."
];

/** The cautions for a run sparging this O2 fraction: the enrichment one only when the gas is enriched. */
export function studyCautions(o2MoleFraction: number): string[] {
	return STUDY_CAUTIONS.filter(
		(caution) => caution !== OXYGEN_ENRICHMENT_CAUTION || isOxygenEnriched(o2MoleFraction)
	);
}
