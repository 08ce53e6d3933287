import { describe, expect, it } from 'vitest';
import { ChemistryInputError } from '../../chemistry/errors';
import {
	DEFAULT_HEAT_PER_MOL_O2_KJ,
	HEAT_PER_OXYGEN_FACTORS,
	assessCooling,
	computeMetabolicHeat
} from '../../chemistry/heat';

describe('heat of fermentation from OUR', () => {
	it('uses 440 kJ/mol O2 by default (Birou, Marison & von Stockar 1987)', () => {
		expect(DEFAULT_HEAT_PER_MOL_O2_KJ).toBe(440);
		expect(HEAT_PER_OXYGEN_FACTORS.find((f) => f.kJPerMolO2 === 440)?.source).toContain('Birou');
	});

	it('converts 100 mmol/(L·h) × 440 kJ/mol to W/L, worked by hand', () => {
		// 100 mmol/(L·h) = 0.1 mol/(L·h); × 440 kJ/mol = 44 kJ/(L·h) = 44 000 J / 3600 s = 12.222 W/L;
		// × 10 L = 122.22 W = 0.12222 kW.
		const q = computeMetabolicHeat({ ourMmolPerLH: 100, workingVolumeL: 10 });
		expect(q.wPerL).toBeCloseTo(12.2222, 4);
		expect(q.totalW).toBeCloseTo(122.222, 3);
		expect(q.totalKW).toBeCloseTo(0.122222, 6);
	});

	it('lets the user choose the factor: 106 kcal/mol ≈ 443 kJ/mol, and 460 (from memory)', () => {
		// 106 kcal/mol (J. Chem. Technol. Biotechnol., doi 10.1002/jctb.5020260179) × 4.184 = 443.5 kJ/mol.
		const jctb = HEAT_PER_OXYGEN_FACTORS.find((f) => f.id === 'jctb-106-kcal');
		expect(jctb?.kJPerMolO2).toBeCloseTo(443.5, 1);
		// 50 mmol/(L·h) × 460 kJ/mol = 23 kJ/(L·h) = 6.389 W/L.
		expect(
			computeMetabolicHeat({ ourMmolPerLH: 50, workingVolumeL: 1, heatPerMolO2KJ: 460 }).wPerL
		).toBeCloseTo(6.3889, 4);
	});

	it('compares heat plus agitation with the cooling capacity', () => {
		// 200 mmol/(L·h) × 440 kJ/mol / 3600 = 24.444 W/L × 100 L = 2444.4 W, + 500 W agitation = 2944.4 W.
		const short = assessCooling({
			ourMmolPerLH: 200,
			workingVolumeL: 100,
			coolingCapacityW: 2500,
			agitationPowerW: 500
		});
		expect(short.heatLoadW).toBeCloseTo(2944.44, 2);
		expect(short.verdict).toBe('insufficient');
		expect(short.marginW).toBeCloseTo(2500 - 2944.44, 2);
		const enough = assessCooling({
			ourMmolPerLH: 200,
			workingVolumeL: 100,
			coolingCapacityW: 3000,
			agitationPowerW: 500
		});
		expect(enough.verdict).toBe('sufficient');
		expect(enough.utilisation).toBeCloseTo(2944.44 / 3000, 4);
	});

	it('refuses a factor that looks like kcal or J, and a missing volume', () => {
		const e = (() => {
			try {
				computeMetabolicHeat({ ourMmolPerLH: 10, workingVolumeL: 1, heatPerMolO2KJ: 106 });
			} catch (err) {
				return err as ChemistryInputError;
			}
			throw new Error('expected an error');
		})();
		expect(e).toBeInstanceOf(ChemistryInputError);
		expect(e.field).toBe('heatPerMolO2KJ');
		expect(() => computeMetabolicHeat({ ourMmolPerLH: 10, workingVolumeL: 0 })).toThrow(
			ChemistryInputError
		);
	});
});
