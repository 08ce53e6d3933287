/**
 * Batch against continuous biomass productivity, the textbook comparison (e.g. Shuler & Kargi,
 * Bioprocess Engineering, 2nd ed., 2002, chapter 9; citation from memory).
 *
 * Batch time from the closed-form Monod batch without maintenance, X = X0 + Y(S0 − S), which
 * integrates to (textbook form, from memory):
 *   μmax·t = (1 + Ks·Y/A)·ln(X/X0) − (Ks·Y/A)·ln(S/S0),   A = X0 + Y·S0.
 * Batch productivity counts the biomass made in one cycle over the growth time plus turnaround;
 * continuous productivity is the chemostat's D·X at steady state (chemostat.ts). With Ks ≪ S0 and D
 * near μmax their ratio approaches ln(Xm/X0) + μmax·t_turnaround.
 */
import { computeChemostatOperatingPoint, validateMonodChemostatParameters } from './chemostat';
import { ChemistryInputError } from './errors';

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
	/** ln(Xm/X0) + μmax·t_turnaround, the Ks ≪ S0 estimate of the best attainable ratio */
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

function readHours(value: unknown, field: string): number {
	if (value === undefined || value === null) return 0;
	if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
		throw new ChemistryInputError(
			`${field} must be a number of hours ≥ 0 (got ${String(value)}).`,
			{ field }
		);
	}
	return value;
}

export function compareBatchWithContinuous(
	input: BatchVersusContinuousInput
): BatchVersusContinuous {
	const chemostat = {
		muMaxPerH: input.muMaxPerH,
		ksGPerL: input.ksGPerL,
		yieldXS: input.yieldXS,
		feedSubstrateGPerL: input.substrateGPerL
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
	const x0 = input.inoculumGPerL;
	if (typeof x0 !== 'number' || !Number.isFinite(x0) || x0 <= 0) {
		throw new ChemistryInputError(
			`inoculumGPerL must be a finite number greater than 0 (got ${String(x0)}).`,
			{
				field: 'inoculumGPerL'
			}
		);
	}
	const d = input.dilutionPerH;
	if (typeof d !== 'number' || !Number.isFinite(d) || d <= 0) {
		throw new ChemistryInputError(
			`dilutionPerH must be a finite number greater than 0 (got ${String(d)}).`,
			{
				field: 'dilutionPerH'
			}
		);
	}
	const conversion = input.conversion ?? 0.99;
	if (typeof conversion !== 'number' || !(conversion > 0 && conversion < 1)) {
		throw new ChemistryInputError(
			`conversion must be a fraction between 0 and 1 (got ${String(conversion)}).`,
			{
				field: 'conversion'
			}
		);
	}
	const t = input.turnaround ?? {};
	const turnaroundH =
		readHours(t.cleaningH, 'turnaround.cleaningH') +
		readHours(t.sterilisingH, 'turnaround.sterilisingH') +
		readHours(t.fillingH, 'turnaround.fillingH') +
		readHours(t.lagH, 'turnaround.lagH');

	const s0 = input.substrateGPerL;
	const sEnd = (1 - conversion) * s0;
	const growthTimeH = computeMonodBatchTimeH(input, x0, s0, sEnd);
	const finalBiomassGPerL = x0 + input.yieldXS * (s0 - sEnd);
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
