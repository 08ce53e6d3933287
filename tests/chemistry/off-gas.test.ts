import { describe, expect, it } from 'vitest';
import {
	MAX_INERT_FRACTION_CHANGE,
	computeIdealMolarVolumeLPerMol,
	computeInSituKla,
	computeOffGasRates,
	integrateGasExchange,
	type OffGasMeasurement
} from '../../chemistry/off-gas/balance';
import { errorOf } from './input-error';

// Air in, a respiring culture's off-gas out: 1 vvm (10 standard L/min) on 10 L, 0 °C and 101.325 kPa.
const AIR_RUN: OffGasMeasurement = {
	inletGasFlowLPerMin: 10,
	inletO2Fraction: 0.2095,
	inletCo2Fraction: 0.0004,
	outletO2Fraction: 0.195,
	outletCo2Fraction: 0.015,
	liquidVolumeL: 10
};

describe('OUR, CER and RQ by the inert-gas balance', () => {
	it('matches a hand calculation, step by step', () => {
		// Ideal gas law, R = 8.314462618 J/(mol·K) (CODATA 2018):
		// Vm = 8.314462618 × 273.15 / 101.325 = 22.413970 L/mol.
		// F_in = 10 L/min × 60 min/h / 22.413970 L/mol = 26.769020 mol/h.
		// y_I,in = 1 − 0.2095 − 0.0004 = 0.7901; y_I,out = 1 − 0.1950 − 0.0150 = 0.7900.
		// F_out = 26.769020 × 0.7901/0.7900 = 26.772409 mol/h.
		// OUR = (26.769020 × 0.2095 − 26.772409 × 0.1950)/10 L = (5.608110 − 5.220620)/10
		//     = 0.038749 mol/(L·h) = 38.749 mmol/(L·h).
		// CER = (26.772409 × 0.0150 − 26.769020 × 0.0004)/10 = (0.401586 − 0.010708)/10
		//     = 0.039088 mol/(L·h) = 39.088 mmol/(L·h).
		// RQ = 39.088/38.749 = 1.0087.
		const rates = computeOffGasRates(AIR_RUN);
		expect(rates.molarVolumeLPerMol).toBeCloseTo(22.41397, 5);
		expect(rates.inletFlowMolPerH).toBeCloseTo(26.76902, 5);
		expect(rates.inletInertFraction).toBeCloseTo(0.7901, 12);
		expect(rates.outletInertFraction).toBeCloseTo(0.79, 12);
		expect(rates.outletFlowMolPerH).toBeCloseTo(26.772409, 5);
		expect(rates.ourMmolPerLH).toBeCloseTo(38.749, 2);
		expect(rates.cerMmolPerLH).toBeCloseTo(39.088, 2);
		expect(rates.respiratoryQuotient).toBeCloseTo(1.0087, 4);
	});

	it('recovers OUR and CER from outlet fractions built the other way round, by mass balance', () => {
		// Choose the rates, then build the outlet gas: what leaves is what came in, less the O2 taken
		// up, plus the CO2 given off; N2 passes unchanged.
		const inletMolPerH = 3.2;
		const volumeL = 2.5;
		const ourMmolPerLH = 55;
		const cerMmolPerLH = 48;
		const [yO2In, yCo2In] = [0.3, 0.001];
		const o2OutMolPerH = inletMolPerH * yO2In - (ourMmolPerLH * volumeL) / 1000;
		const co2OutMolPerH = inletMolPerH * yCo2In + (cerMmolPerLH * volumeL) / 1000;
		const inertMolPerH = inletMolPerH * (1 - yO2In - yCo2In);
		const outletMolPerH = o2OutMolPerH + co2OutMolPerH + inertMolPerH;
		const rates = computeOffGasRates({
			inletGasFlowMolPerH: inletMolPerH,
			inletO2Fraction: yO2In,
			inletCo2Fraction: yCo2In,
			outletO2Fraction: o2OutMolPerH / outletMolPerH,
			outletCo2Fraction: co2OutMolPerH / outletMolPerH,
			liquidVolumeL: volumeL
		});
		expect(rates.ourMmolPerLH).toBeCloseTo(ourMmolPerLH, 9);
		expect(rates.cerMmolPerLH).toBeCloseTo(cerMmolPerLH, 9);
		expect(rates.outletFlowMolPerH).toBeCloseTo(outletMolPerH, 12);
		expect(rates.respiratoryQuotient).toBeCloseTo(48 / 55, 9);
		expect(rates.molarVolumeLPerMol).toBeNull();
	});

	it('takes a flow stated at other reference conditions through the ideal gas law', () => {
		// At 20 °C and 100 kPa: Vm = 8.314462618 × 293.15 / 100 = 24.373847 L/mol.
		expect(computeIdealMolarVolumeLPerMol(20, 100)).toBeCloseTo(24.373847, 6);
		const at20 = computeOffGasRates({
			...AIR_RUN,
			referenceTemperatureC: 20,
			referencePressureKPa: 100
		});
		expect(at20.inletFlowMolPerH).toBeCloseTo(600 / 24.373847, 5);
		// Same gas, fewer moles per litre: OUR scales with the molar flow.
		const standard = computeOffGasRates(AIR_RUN);
		expect(at20.ourMmolPerLH / standard.ourMmolPerLH).toBeCloseTo(22.41397 / 24.373847, 5);
	});

	it('gives no RQ when there is no oxygen uptake', () => {
		const idle = computeOffGasRates({
			...AIR_RUN,
			outletO2Fraction: 0.2095,
			outletCo2Fraction: 0.0004
		});
		expect(idle.ourMmolPerLH).toBeCloseTo(0, 12);
		expect(idle.respiratoryQuotient).toBeNull();
	});

	it('refuses bad input, naming the field by its label', () => {
		const percent = errorOf(() => computeOffGasRates({ ...AIR_RUN, outletO2Fraction: 19.5 }));
		expect(percent.field).toBe('outletO2Fraction');
		expect(percent.message).toContain('Outlet O₂ fraction');
		expect(percent.message).toContain('not %');

		const inletSum = errorOf(() =>
			computeOffGasRates({ ...AIR_RUN, inletO2Fraction: 0.9, inletCo2Fraction: 0.2 })
		);
		expect(inletSum.field).toBe('inletCo2Fraction');
		expect(inletSum.message).toContain('more than 1');

		const outletSum = errorOf(() =>
			computeOffGasRates({ ...AIR_RUN, outletO2Fraction: 0.7, outletCo2Fraction: 0.4 })
		);
		expect(outletSum.field).toBe('outletCo2Fraction');

		const noInert = errorOf(() =>
			computeOffGasRates({ ...AIR_RUN, inletO2Fraction: 1, inletCo2Fraction: 0 })
		);
		expect(noInert.message).toContain('inert gas');

		const volume = errorOf(() => computeOffGasRates({ ...AIR_RUN, liquidVolumeL: 0 }));
		expect([volume.field, volume.message]).toEqual([
			'liquidVolumeL',
			'Liquid volume must be greater than 0, not 0'
		]);

		const flow = errorOf(() => computeOffGasRates({ ...AIR_RUN, inletGasFlowLPerMin: -1 }));
		expect(flow.message).toBe('Inlet gas flow must be greater than 0, not -1');

		const both = errorOf(() => computeOffGasRates({ ...AIR_RUN, inletGasFlowMolPerH: 2 }));
		expect(both.message).toContain('not both');
		const neither = errorOf(() =>
			computeOffGasRates({ ...AIR_RUN, inletGasFlowLPerMin: undefined })
		);
		expect(neither.message).toContain('Inlet gas flow is missing');
	});

	it('refuses an inert fraction that moves more than the stated bound, and says why', () => {
		expect(MAX_INERT_FRACTION_CHANGE).toBe(0.1);
		// 0.7901 in, 1 − 0.05 − 0.05 = 0.90 out: 11 percentage points.
		const e = errorOf(() =>
			computeOffGasRates({ ...AIR_RUN, outletO2Fraction: 0.05, outletCo2Fraction: 0.05 })
		);
		expect(e.field).toBe('outletO2Fraction');
		expect(e.message).toContain('by 10.99 percentage points, more than 10 percentage points');
		expect(e.message).toContain('only O₂ and CO₂');
		// The same gas passes when the caller widens the bound (enriched inlet gas).
		const widened = computeOffGasRates({
			...AIR_RUN,
			outletO2Fraction: 0.05,
			outletCo2Fraction: 0.05,
			maxInertFractionChange: 0.2
		});
		expect(widened.outletInertFraction).toBeCloseTo(0.9, 12);
	});
});

describe('kLa in a running culture', () => {
	it('is OUR/(C* − C), in mmol/L or in mg/L', () => {
		// 30 mmol/(L·h) over (0.21 − 0.07) mmol/L = 214.29 1/h.
		const molar = computeInSituKla({
			ourMmolPerLH: 30,
			saturationConcentration: 0.21,
			dissolvedConcentration: 0.07,
			concentrationUnit: 'mmol/L'
		});
		expect(molar.kLaPerH).toBeCloseTo(30 / 0.14, 9);
		// The same in mg/L with O2 = 31.998 g/mol (IUPAC 2021 O 15.999): 6.71958 and 2.23986 mg/L.
		const mass = computeInSituKla({
			ourMmolPerLH: 30,
			saturationConcentration: 0.21 * 31.998,
			dissolvedConcentration: 0.07 * 31.998,
			concentrationUnit: 'mg/L'
		});
		expect(mass.kLaPerH).toBeCloseTo(30 / 0.14, 9);
		expect(mass.drivingForceMmolPerL).toBeCloseTo(0.14, 12);
	});

	it('refuses a DO at or above saturation', () => {
		const e = errorOf(() =>
			computeInSituKla({
				ourMmolPerLH: 30,
				saturationConcentration: 7,
				dissolvedConcentration: 7,
				concentrationUnit: 'mg/L'
			})
		);
		expect(e.field).toBe('dissolvedConcentration');
		expect(e.message).toContain('must be below DO saturation C*');
		const unit = errorOf(() =>
			computeInSituKla({
				ourMmolPerLH: 30,
				saturationConcentration: 7,
				dissolvedConcentration: 3,
				concentrationUnit: '%' as 'mg/L'
			})
		);
		expect(unit.field).toBe('concentrationUnit');
	});
});

describe('O2 consumed and CO2 produced over a run', () => {
	it('integrates a linear rate at constant volume exactly', () => {
		// OUR = 10 + 5t mmol/(L·h), V = 2 L, 0–4 h: ∫ = 2 × (10·4 + 5·16/2) = 2 × 80 = 160 mmol.
		// CER = 8 + 6t: 2 × (32 + 48) = 160 mmol as well; pick 8 + 4t: 2 × (32 + 32) = 128 mmol.
		const timeH = [0, 1, 2.5, 4];
		const totals = integrateGasExchange({
			timeH,
			ourMmolPerLH: timeH.map((t) => 10 + 5 * t),
			cerMmolPerLH: timeH.map((t) => 8 + 4 * t),
			volumeL: timeH.map(() => 2)
		});
		expect(totals.o2ConsumedMol).toBeCloseTo(0.16, 12);
		expect(totals.co2ProducedMol).toBeCloseTo(0.128, 12);
		// Running total at 1 h: 2 × (10 + 2.5) = 25 mmol.
		expect(totals.cumulativeO2Mol[1]).toBeCloseTo(0.025, 12);
		expect(totals.cumulativeO2Mol[0]).toBe(0);
	});

	it('with a growing volume, differs from the exact integral by the trapezoid rule’s own error', () => {
		// OUR = 20 + 2t, V = 1 + 0.5t on 0–6 h with steps of h = 1.5 h. OUR·V = 20 + 12t + t²,
		// f'' = 2; exact ∫ = 20t + 6t² + t³/3 at 6 h = 120 + 216 + 72 = 408 mmol.
		// Composite trapezoid error = (b − a)·h²·f''/12 = 6 × 2.25 × 2/12 = 2.25 mmol (above).
		const timeH = [0, 1.5, 3, 4.5, 6];
		const totals = integrateGasExchange({
			timeH,
			ourMmolPerLH: timeH.map((t) => 20 + 2 * t),
			cerMmolPerLH: timeH.map(() => 0),
			volumeL: timeH.map((t) => 1 + 0.5 * t)
		});
		expect(totals.o2ConsumedMol).toBeCloseTo((408 + 2.25) / 1000, 12);
		expect(totals.co2ProducedMol).toBe(0);
	});

	it('refuses a series it cannot integrate, naming the value', () => {
		const base = {
			timeH: [0, 1, 2],
			ourMmolPerLH: [1, 2, 3],
			cerMmolPerLH: [1, 2, 3],
			volumeL: [1, 1, 1]
		};
		const backwards = errorOf(() => integrateGasExchange({ ...base, timeH: [0, 2, 1] }));
		expect(backwards.field).toBe('timeH.2');
		expect(backwards.message).toContain('Time, value 3');
		const volume = errorOf(() => integrateGasExchange({ ...base, volumeL: [1, 0, 1] }));
		expect([volume.field, volume.message]).toEqual([
			'volumeL.1',
			'Liquid volume, value 2 must be greater than 0, not 0'
		]);
		const short = errorOf(() => integrateGasExchange({ ...base, cerMmolPerLH: [1, 2] }));
		expect(short.message).toBe('CER has 2 values, but Time has 3.');
		expect(errorOf(() => integrateGasExchange({ ...base, timeH: [0] })).field).toBe('timeH');
	});
});
