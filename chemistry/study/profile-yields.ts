import { ChemistryInputError } from '../errors';
import { O2_MOLAR_MASS_G_PER_MOL } from '../oxygen';
import type { PerCellConsumption } from '../sufficiency';
import { solveAerobicGrowth } from '../substrate-yield';
import type { SubstrateYieldEntry, YieldMethod } from './vocabulary';

/** What the yield rules read from the profile form, already checked field by field. */
export interface YieldFields {
	kind: string;
	biomassFormula: string | null;
	ashFraction: number | null;
	elementalFractions: Record<string, number> | null;
	perCellConsumption: PerCellConsumption[] | null;
	carbonSourceId: string | null;
	yieldXSMethod: YieldMethod;
	yieldXSGPerG: number | null;
	respiratoryQuotient: number | null;
	muMaxPerH: number | null;
	yieldXO2GPerG: number | null;
	qO2MmolPerGH: number | null;
}

export interface BalancedCarbonYield {
	yieldGPerG: number;
	/** % change of Yx/s per 1 % error in the measured value. */
	elasticity: number;
	/** The measurement, in words, e.g. "RQ 1.05". */
	from: string;
}

/**
 * Yx/O2 in g biomass per g O2 from qO2 (mmol O2 per g biomass per h) taken at μmax: a culture growing
 * at μmax respires qO2 = μmax / Yx/O2.
 */
export function computeOxygenYieldFromUptake(muMaxPerH: number, qO2MmolPerGH: number): number {
	return muMaxPerH / ((qO2MmolPerGH * O2_MOLAR_MASS_G_PER_MOL) / 1000);
}

/**
 * Yx/s on the carbon source (of formula `substrateFormula`) from the C/H/O/N balance of growth on it
 * with NH3 and one measured quantity: the RQ, or the yield on O2 (qO2 stands for Yx/O2 = μmax/qO2 at μmax).
 */
export function balanceCarbonYield(f: YieldFields, substrateFormula: string): BalancedCarbonYield {
	if (!f.biomassFormula)
		throw new ChemistryInputError(
			'Enter the biomass formula: the element balance that gives Yx/s needs it.',
			{ field: 'biomassFormula' }
		);
	let measured: Parameters<typeof solveAerobicGrowth>[0]['measured'];
	let from: string;
	if (f.yieldXSMethod === 'respiratoryQuotient') {
		if (f.respiratoryQuotient === null)
			throw new ChemistryInputError(
				'Enter the measured RQ (mol CO2 per mol O2) to work out Yx/s from it.',
				{ field: 'respiratoryQuotient' }
			);
		measured = { kind: 'respiratoryQuotient', molCo2PerMolO2: f.respiratoryQuotient };
		from = `RQ ${f.respiratoryQuotient}`;
	} else if (f.yieldXO2GPerG !== null) {
		measured = { kind: 'oxygenYield', gBiomassPerGO2: f.yieldXO2GPerG };
		from = `Yx/O2 ${f.yieldXO2GPerG} g/g`;
	} else if (f.qO2MmolPerGH !== null && f.muMaxPerH !== null) {
		measured = {
			kind: 'oxygenYield',
			gBiomassPerGO2: computeOxygenYieldFromUptake(f.muMaxPerH, f.qO2MmolPerGH)
		};
		from = `qO2 ${f.qO2MmolPerGH} mmol/(g·h) at μmax ${f.muMaxPerH} /h`;
	} else {
		throw new ChemistryInputError(
			'Enter Yx/O2, or qO2 with μmax, to work out Yx/s from the oxygen yield.',
			{ field: 'yieldXO2GPerG' }
		);
	}
	let solved: ReturnType<typeof solveAerobicGrowth>;
	try {
		solved = solveAerobicGrowth({
			substrateFormula,
			biomassFormula: f.biomassFormula,
			ashFraction: f.ashFraction ?? 0,
			measured
		});
	} catch (cause) {
		// The balance fails for the method chosen, whichever of its inputs the solver names.
		if (cause instanceof ChemistryInputError)
			throw new ChemistryInputError(cause.message, { field: 'yieldXSMethod' });
		throw cause;
	}
	return {
		yieldGPerG: Number(solved.biomassOnSubstrateGPerG.toPrecision(4)),
		elasticity: solved.yieldElasticity,
		from
	};
}

/**
 * Where Yx/s on the carbon source came from, in one line for the profile page and the report. The
 * formula comes with the caller's loaded data.
 */
export function describeCarbonYield(f: YieldFields, carbonSourceFormula: string | null): string {
	if (f.yieldXSMethod === 'entered') return 'Entered on the profile';
	try {
		if (!carbonSourceFormula)
			throw new ChemistryInputError('the carbon source has no formula in the library.');
		const b = balanceCarbonYield(f, carbonSourceFormula);
		const sensitivity = Number.isFinite(b.elasticity)
			? `; a 1 % error in it moves Yx/s by about ${Math.abs(b.elasticity).toPrecision(2)} %`
			: '; the value sits at the edge of what the balance allows';
		return `Element balance (C, H, O, N; NH3 as N source) from ${b.from}${sensitivity}`;
	} catch (cause) {
		if (cause instanceof ChemistryInputError)
			return `Element balance, which now fails: ${cause.message}`;
		throw cause;
	}
}

/** One line saying where a yield came from, for the profile page and the study report. */
export function describeSubstrateYield(y: SubstrateYieldEntry): string {
	return y.method === 'soleSource'
		? `Element balance: the only source of ${y.element}, Yx/s = w_${y.element}(substrate) / w_${y.element}(biomass)`
		: 'Entered on the profile';
}
