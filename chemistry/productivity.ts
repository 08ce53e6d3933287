/**
 * Batch against continuous biomass productivity, the textbook comparison (e.g. Shuler & Kargi,
 * Bioprocess Engineering, 2nd ed., 2002, chapter 9; citation from memory).
 *
 * Batch time from the closed-form Monod batch without maintenance, X = X0 + Y(S0 − S), which
 * integrates to (textbook form, from memory):
 *   μmax·t = (1 + Ks·Y/A)·ln(X/X0) − (Ks·Y/A)·ln(S/S0),   A = X0 + Y·S0.
 * With Pirt's maintenance m_s (Pirt 1965, Proc. R. Soc. Lond. B 163:224), the same organism draws
 * substrate at (μ/Y_G + m_s)·X in the batch too, so both sides of the comparison carry it: the batch
 * is integrated (RODAS, chemistry/ode) over the substrate used, σ = S0 − S, from 0 to the harvest conversion:
 *   dX/dσ = μ/(μ/Y_G + m_s),   dt/dσ = 1/((μ/Y_G + m_s)·X),
 * which has no closed form for t. Without maintenance the closed form above is kept.
 * Batch productivity counts the biomass made in one cycle over the growth time plus turnaround;
 * continuous productivity is the chemostat's D·X at steady state (chemostat.ts), with the same m_s.
 * With Ks ≪ S0, D near μmax and no maintenance their ratio approaches ln(Xm/X0) + μmax·t_turnaround.
 */
import { RosenbrockSolver } from './ode';
import { computeChemostatOperatingPoint, validateMonodChemostatParameters } from './chemostat';
import { ChemistryInputError } from './errors';
import { NON_NEGATIVE, POSITIVE, readNumber, readOptional, type Bounds } from './input';

/** Fraction of the substrate used at harvest: strictly between 0 and 1. */
export const CONVERSION_BOUNDS: Bounds = { min: 0, max: 1 };
export const DEFAULT_CONVERSION = 0.99;
/** Each turnaround step, h. */
export const TURNAROUND_HOURS_BOUNDS: Bounds = NON_NEGATIVE;

export interface TurnaroundInput {
	cleaningH?: number;
	sterilisingH?: number;
	fillingH?: number;
	lagH?: number;
}

export interface BatchVersusContinuousInput {
	muMaxPerH: number;
	ksGPerL: number;
	yieldXS: number;
	/** initial substrate of the batch, and the chemostat's feed substrate */
	substrateGPerL: number;
	/** batch inoculum, g/L */
	inoculumGPerL: number;
	/** chemostat dilution rate */
	dilutionPerH: number;
	turnaround: TurnaroundInput;
	/** fraction of the substrate consumed when the batch is harvested; default 0.99 */
	conversion?: number;
	/** Pirt's maintenance coefficient m_s, g substrate / g biomass / h, in batch and chemostat; default 0 */
	maintenanceGPerGH?: number;
}

export interface BatchVersusContinuous {
	batch: {
		growthTimeH: number;
		turnaroundH: number;
		cycleTimeH: number;
		finalBiomassGPerL: number;
		productivityGPerLH: number;
	};
	continuous: {
		dilutionPerH: number;
		biomassGPerL: number;
		substrateGPerL: number;
		productivityGPerLH: number;
		washout: boolean;
	};
	/** continuous over batch productivity */
	continuousToBatchRatio: number;
	/**
	 * ln(Xm/X0) + μmax·t_turnaround with Xm = X0 + Y·S0, the Ks ≪ S0 estimate of the best attainable
	 * ratio without maintenance
	 */
	textbookRatioEstimate: number;
}

/** Time for a Monod batch (no maintenance) to bring substrate from S0 down to S, h. */
export function computeMonodBatchTimeH(
	p: { muMaxPerH: number; ksGPerL: number; yieldXS: number },
	initialBiomassGPerL: number,
	initialSubstrateGPerL: number,
	substrateGPerL: number
): number {
	const a = initialBiomassGPerL + p.yieldXS * initialSubstrateGPerL;
	const x = initialBiomassGPerL + p.yieldXS * (initialSubstrateGPerL - substrateGPerL);
	const k = (p.ksGPerL * p.yieldXS) / a;
	return (
		((1 + k) * Math.log(x / initialBiomassGPerL) -
			k * Math.log(substrateGPerL / initialSubstrateGPerL)) /
		p.muMaxPerH
	);
}

/** Integrator tolerances (hours and g/L alike) for the batch with maintenance. */
const BATCH_TOLERANCE = 1e-10;
const BATCH_MAX_STEPS = 100_000;

/**
 * Monod batch with Pirt maintenance from S0 to S, integrated over the substrate used (see the top
 * of this file): growth time, h, and biomass at S, g/L.
 */
export function computeMonodBatchWithMaintenance(
	p: { muMaxPerH: number; ksGPerL: number; yieldXS: number; maintenanceGPerGH: number },
	initialBiomassGPerL: number,
	initialSubstrateGPerL: number,
	substrateGPerL: number
): { growthTimeH: number; biomassGPerL: number } {
	const { muMaxPerH, ksGPerL, yieldXS, maintenanceGPerGH } = p;
	const rates = [0, 0];
	// state: [t, X]; independent variable σ = S0 − S
	const derivative = (sigma: number, y: number[]) => {
		const s = Math.max(initialSubstrateGPerL - sigma, 0);
		const mu = (muMaxPerH * s) / (ksGPerL + s);
		const uptakePerBiomass = mu / yieldXS + maintenanceGPerGH;
		rates[0] = 1 / (uptakePerBiomass * y[1]);
		rates[1] = mu / uptakePerBiomass;
		return rates;
	};
	const solver = new RosenbrockSolver(2, {
		absoluteTolerance: BATCH_TOLERANCE,
		relativeTolerance: BATCH_TOLERANCE,
		maxSteps: BATCH_MAX_STEPS
	});
	const result = solver.solve(
		derivative,
		0,
		[0, initialBiomassGPerL],
		initialSubstrateGPerL - substrateGPerL
	);
	if (result.outcome !== 'done') {
		throw new ChemistryInputError(
			`The batch with maintenance could not be integrated to the harvest conversion in ${BATCH_MAX_STEPS} steps; check maintenanceGPerGH and the kinetics.`,
			{ field: 'maintenanceGPerGH' }
		);
	}
	return { growthTimeH: result.y[0], biomassGPerL: result.y[1] };
}

function readHours(value: unknown, field: string): number {
	return readOptional(value, field, 0, TURNAROUND_HOURS_BOUNDS);
}

export function compareBatchWithContinuous(
	input: BatchVersusContinuousInput
): BatchVersusContinuous {
	const chemostat = {
		muMaxPerH: input.muMaxPerH,
		ksGPerL: input.ksGPerL,
		yieldXS: input.yieldXS,
		feedSubstrateGPerL: input.substrateGPerL,
		maintenanceGPerGH: input.maintenanceGPerGH
	};
	try {
		validateMonodChemostatParameters(chemostat);
	} catch (error) {
		if (error instanceof ChemistryInputError && error.field === 'feedSubstrateGPerL') {
			throw new ChemistryInputError(error.message.replace('feedSubstrateGPerL', 'substrateGPerL'), {
				field: 'substrateGPerL'
			});
		}
		throw error;
	}
	const x0 = readNumber(input.inoculumGPerL, 'inoculumGPerL', POSITIVE);
	const d = readNumber(input.dilutionPerH, 'dilutionPerH', POSITIVE);
	const conversion = readOptional(
		input.conversion,
		'conversion',
		DEFAULT_CONVERSION,
		CONVERSION_BOUNDS
	);
	const t = input.turnaround ?? {};
	const turnaroundH =
		readHours(t.cleaningH, 'turnaround.cleaningH') +
		readHours(t.sterilisingH, 'turnaround.sterilisingH') +
		readHours(t.fillingH, 'turnaround.fillingH') +
		readHours(t.lagH, 'turnaround.lagH');

	const s0 = input.substrateGPerL;
	const sEnd = (1 - conversion) * s0;
	const maintenanceGPerGH = input.maintenanceGPerGH ?? 0;
	const { growthTimeH, biomassGPerL: finalBiomassGPerL } =
		maintenanceGPerGH === 0
			? {
					growthTimeH: computeMonodBatchTimeH(input, x0, s0, sEnd),
					biomassGPerL: x0 + input.yieldXS * (s0 - sEnd)
				}
			: computeMonodBatchWithMaintenance({ ...input, maintenanceGPerGH }, x0, s0, sEnd);
	const cycleTimeH = growthTimeH + turnaroundH;
	const batchProductivity = (finalBiomassGPerL - x0) / cycleTimeH;
	const { washout, ...point } = computeChemostatOperatingPoint(chemostat, d);
	return {
		batch: {
			growthTimeH,
			turnaroundH,
			cycleTimeH,
			finalBiomassGPerL,
			productivityGPerLH: batchProductivity
		},
		continuous: { ...point, washout },
		continuousToBatchRatio: point.productivityGPerLH / batchProductivity,
		textbookRatioEstimate: Math.log((x0 + input.yieldXS * s0) / x0) + input.muMaxPerH * turnaroundH
	};
}
