/**
 * Heat of fermentation from oxygen uptake. Aerobic growth releases heat in proportion to the O2
 * consumed (Cooney, Wang & Mateles, Biotechnol. Bioeng. 11(3), 1969, doi 10.1002/bit.260110302),
 * so Q = q_O2 · OUR with q_O2 an oxycaloric factor in kJ per mol O2.
 */
import { ChemistryInputError } from './errors';
import { SECONDS_PER_HOUR } from './units';
import { readNonNegative, readPositive } from './input';

export interface HeatFactor {
	id: string;
	kJPerMolO2: number;
	source: string;
	confidence: 'confirmed' | 'from memory';
}

export const HEAT_PER_OXYGEN_FACTORS: readonly HeatFactor[] = [
	{
		id: 'birou-marison-von-stockar-1987',
		kJPerMolO2: 440,
		source:
			'Birou, Marison & von Stockar, Biotechnol. Bioeng. 30:650 (1987): constant across experiments',
		confidence: 'confirmed'
	},
	{
		id: 'jctb-106-kcal',
		kJPerMolO2: 106 * 4.184,
		source:
			'106 kcal/mol O2 (≈ 443 kJ/mol), J. Chem. Technol. Biotechnol., doi 10.1002/jctb.5020260179',
		confidence: 'confirmed'
	},
	{ id: 'textbook-460', kJPerMolO2: 460, source: 'textbook value', confidence: 'from memory' }
];

export const DEFAULT_HEAT_PER_MOL_O2_KJ = 440;
export const DEFAULT_HEAT_PER_MOL_O2_SOURCE =
	'Birou, Marison & von Stockar, Biotechnol. Bioeng. 30:650 (1987)';

/**
 * Accepted oxycaloric factors, kJ/mol O2. Published values cluster near 440–460 kJ/mol (see
 * HEAT_PER_OXYGEN_FACTORS); this wider band is a guard against unit slips (kcal/mol is ×4.184 off,
 * J/mol ×1000), not a published range.
 */
export const HEAT_PER_MOL_O2_RANGE_KJ = { min: 300, max: 600 } as const;

export interface MetabolicHeatInput {
	/** Oxygen uptake rate, mmol O2 per litre per hour. */
	ourMmolPerLH: number;
	workingVolumeL: number;
	/** Oxycaloric factor, kJ per mol O2; default 440 (Birou, Marison & von Stockar 1987). */
	heatPerMolO2KJ?: number;
}

export interface MetabolicHeatResult {
	heatPerMolO2KJ: number;
	wPerL: number;
	totalW: number;
	totalKW: number;
}

/** W/L = OUR [mmol/(L·h)] × 1e-3 mol/mmol × q [kJ/mol] × 1e3 J/kJ / 3600 s/h. */
export function computeMetabolicHeat(input: MetabolicHeatInput): MetabolicHeatResult {
	const our = readNonNegative(input.ourMmolPerLH, 'ourMmolPerLH', 'OUR');
	const volumeL = readPositive(input.workingVolumeL, 'workingVolumeL', 'Working volume');
	const q = readPositive(
		input.heatPerMolO2KJ ?? DEFAULT_HEAT_PER_MOL_O2_KJ,
		'heatPerMolO2KJ',
		'Heat per mol O2'
	);
	if (q < HEAT_PER_MOL_O2_RANGE_KJ.min || q > HEAT_PER_MOL_O2_RANGE_KJ.max) {
		throw new ChemistryInputError(
			`Heat per mol O2 ${q} kJ/mol is outside the plausible range ${HEAT_PER_MOL_O2_RANGE_KJ.min} to ${HEAT_PER_MOL_O2_RANGE_KJ.max} kJ/mol`,
			{
				field: 'heatPerMolO2KJ'
			}
		);
	}
	const wPerL = (our * q) / SECONDS_PER_HOUR;
	const totalW = wPerL * volumeL;
	return { heatPerMolO2KJ: q, wPerL, totalW, totalKW: totalW / 1000 };
}

export interface CoolingInput extends MetabolicHeatInput {
	coolingCapacityW: number;
	/** Agitator power dissipated in the broth, W; adds to the load (common practice). Default 0. */
	agitationPowerW?: number;
}

export interface CoolingResult extends MetabolicHeatResult {
	agitationPowerW: number;
	/** Metabolic heat plus agitation, W. */
	heatLoadW: number;
	coolingCapacityW: number;
	/** heat load / cooling capacity. */
	utilisation: number;
	/** cooling capacity − heat load, W; negative when short. */
	marginW: number;
	verdict: 'sufficient' | 'insufficient';
}

/** Can the jacket/coil remove the heat of fermentation (plus agitation) at the peak OUR? */
export function assessCooling(input: CoolingInput): CoolingResult {
	const heat = computeMetabolicHeat(input);
	const coolingCapacityW = readPositive(
		input.coolingCapacityW,
		'coolingCapacityW',
		'Cooling capacity'
	);
	const agitationPowerW = readNonNegative(
		input.agitationPowerW ?? 0,
		'agitationPowerW',
		'Agitation power'
	);
	const heatLoadW = heat.totalW + agitationPowerW;
	return {
		...heat,
		agitationPowerW,
		heatLoadW,
		coolingCapacityW,
		utilisation: heatLoadW / coolingCapacityW,
		marginW: coolingCapacityW - heatLoadW,
		verdict: heatLoadW <= coolingCapacityW ? 'sufficient' : 'insufficient'
	};
}
