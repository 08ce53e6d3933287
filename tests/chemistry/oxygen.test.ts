import { describe, expect, it } from 'vitest';
import {
	AIR_O2_MOLE_FRACTION,
	O2_MOLAR_MASS_G_PER_MOL,
	assessOxygenTransfer,
	computeMaxOtr,
	computeOxygenDemand,
	computeOxygenReserveS,
	computeOxygenSaturation,
	computeOxygenUptakeRate,
	computeWaterDensityKgPerL
} from '../../chemistry/oxygen';
import { errorOf } from './input-error';

describe('O2 saturation, Benson & Krause (1984) in the APHA 4500-O form', () => {
	// Fresh water, moist air, 1 atm. Table values: ISO 5814 as printed by an instrument maker;
	// Montgomery et al. (1964) — chemistry/REFERENCES.md.
	it.each([
		[20, 9.09],
		[25, 8.26],
		[30, 7.56]
	])('at %d °C matches the published table value %d mg/L within 0.02', (t, table) => {
		const r = computeOxygenSaturation({ temperatureC: t });
		expect(r.method).toBe('benson-krause-1984');
		expect(Math.abs(r.mgPerL - table)).toBeLessThanOrEqual(0.02);
	});

	it('at 37 °C gives the equation value 6.727 mg/L = 0.2102 mmol/L', () => {
		// Equation-derived check value (D) in chemistry/REFERENCES.md.
		const r = computeOxygenSaturation({ temperatureC: 37 });
		expect(r.mgPerL).toBeCloseTo(6.727, 3);
		expect(r.mmolPerL).toBeCloseTo(0.2102, 4);
	});

	it('converts mg/L to mmol/L with O2 = 31.998 g/mol (IUPAC 2021: 2 × 15.999)', () => {
		expect(O2_MOLAR_MASS_G_PER_MOL).toBeCloseTo(31.998, 10);
		const r = computeOxygenSaturation({ temperatureC: 25 });
		expect(r.mmolPerL * 31.998).toBeCloseTo(r.mgPerL, 10);
	});

	it('falls with salinity: seawater (S = 35) holds about a fifth less than fresh water at 25 °C', () => {
		// Cross-method check: Garcia & Gordon (1992) refit the same Benson & Krause data, so both
		// methods must agree on seawater to well under 1 %.
		const bk = computeOxygenSaturation({ temperatureC: 25, salinityGPerKg: 35 });
		const gg = computeOxygenSaturation({
			temperatureC: 25,
			salinityGPerKg: 35,
			method: 'garcia-gordon-1992'
		});
		const fresh = computeOxygenSaturation({ temperatureC: 25 });
		expect(Math.abs(bk.mgPerL - gg.mgPerL) / bk.mgPerL).toBeLessThan(0.005);
		expect(bk.mgPerL / fresh.mgPerL).toBeGreaterThan(0.75);
		expect(bk.mgPerL / fresh.mgPerL).toBeLessThan(0.85);
	});

	it('scales with the O2 mole fraction of the gas at the same total pressure', () => {
		const air = computeOxygenSaturation({ temperatureC: 37 });
		const oxygen = computeOxygenSaturation({ temperatureC: 37, o2MoleFraction: 1 });
		const enriched = computeOxygenSaturation({ temperatureC: 37, o2MoleFraction: 0.4 });
		expect(oxygen.mgPerL / air.mgPerL).toBeCloseTo(1 / AIR_O2_MOLE_FRACTION, 10);
		expect(enriched.mgPerL / air.mgPerL).toBeCloseTo(0.4 / 0.20946, 10);
		expect(oxygen.airSaturationMgPerL).toBeCloseTo(air.mgPerL, 10);
	});

	it('follows Henry’s law with pressure: C* ∝ (P − Pwv) to within the small virial term θ', () => {
		// APHA/USGS correction: θ ≈ 0.00065 at 25 °C, so the departure from (P − Pwv) scaling is < 0.1 %.
		const base = computeOxygenSaturation({ temperatureC: 25 });
		for (const pressureKPa of [80, 150, 250]) {
			const r = computeOxygenSaturation({ temperatureC: 25, pressureKPa });
			const henry =
				(pressureKPa - base.waterVapourPressureKPa) / (101.325 - base.waterVapourPressureKPa);
			expect(Math.abs(r.mgPerL / base.mgPerL / henry - 1)).toBeLessThan(0.001);
		}
		expect(base.pressureFactor).toBeCloseTo(1, 12);
	});

	it('uses a water vapour pressure close to steam-table values', () => {
		// 3.169 kPa at 25 °C and 6.28 kPa at 37 °C (steam tables; from memory).
		expect(computeOxygenSaturation({ temperatureC: 25 }).waterVapourPressureKPa).toBeCloseTo(
			3.169,
			1
		);
		expect(computeOxygenSaturation({ temperatureC: 37 }).waterVapourPressureKPa).toBeCloseTo(
			6.28,
			1
		);
	});

	it('agrees with Henry’s law from the Sander (2023) compilation within 5 %', () => {
		// H^cp = 1.3e-5 mol m⁻³ Pa⁻¹ at 298.15 K, d ln H / d(1/T) = 1500 K (Sander 2023). Loose: H is
		// given to two significant figures (±4 %) and ignores the small non-ideal terms of the fit.
		for (const t of [25, 37]) {
			const T = t + 273.15;
			const hcp = 1.3e-5 * Math.exp(1500 * (1 / T - 1 / 298.15));
			const r = computeOxygenSaturation({ temperatureC: t });
			const pO2Pa = 0.20946 * (101325 - r.waterVapourPressureKPa * 1000);
			const henryMmolPerL = hcp * pO2Pa; // mol/m³ = mmol/L
			expect(Math.abs(r.mmolPerL / henryMmolPerL - 1)).toBeLessThan(0.05);
		}
	});

	it('says which range it accepts when the temperature is outside 0–50 °C', () => {
		const e = errorOf(() => computeOxygenSaturation({ temperatureC: 55 }));
		expect(e.field).toBe('temperatureC');
		expect(e.message).toContain('0 to 50 °C');
		expect(e.message).toContain('Benson & Krause');
		expect(errorOf(() => computeOxygenSaturation({ temperatureC: -1 })).message).toContain(
			'0 to 50 °C'
		);
	});

	it('refuses a pressure at or below the water vapour pressure and a mole fraction above 1', () => {
		expect(errorOf(() => computeOxygenSaturation({ temperatureC: 37, pressureKPa: 5 })).field).toBe(
			'pressureKPa'
		);
		expect(
			errorOf(() => computeOxygenSaturation({ temperatureC: 37, o2MoleFraction: 1.2 })).field
		).toBe('o2MoleFraction');
		expect(errorOf(() => computeOxygenSaturation({ temperatureC: Number.NaN })).field).toBe(
			'temperatureC'
		);
	});
});

describe('O2 saturation, Garcia & Gordon (1992) combined fit', () => {
	it('gives the published check value 274.646 µmol/kg at 10 °C, S = 35', () => {
		// Garcia & Gordon (1992), L&O 37:1307 — chemistry/REFERENCES.md.
		const r = computeOxygenSaturation({
			temperatureC: 10,
			salinityGPerKg: 35,
			method: 'garcia-gordon-1992'
		});
		expect(r.method).toBe('garcia-gordon-1992');
		expect(r.umolPerKg).toBeCloseTo(274.646, 3);
	});

	it('agrees with Benson & Krause in fresh water within 0.3 %', () => {
		for (const t of [5, 20, 37]) {
			const gg = computeOxygenSaturation({ temperatureC: t, method: 'garcia-gordon-1992' });
			const bk = computeOxygenSaturation({ temperatureC: t });
			expect(Math.abs(gg.mgPerL / bk.mgPerL - 1)).toBeLessThan(0.003);
		}
	});

	it('says its range when the temperature or salinity is outside −2 to 40 °C, S 0–42', () => {
		const e = errorOf(() =>
			computeOxygenSaturation({ temperatureC: 45, method: 'garcia-gordon-1992' })
		);
		expect(e.message).toContain('-2 to 40 °C');
		expect(e.field).toBe('temperatureC');
		const s = errorOf(() =>
			computeOxygenSaturation({
				temperatureC: 20,
				salinityGPerKg: 50,
				method: 'garcia-gordon-1992'
			})
		);
		expect(s.message).toContain('0 to 42 g/kg');
	});

	it('converts with the Millero & Poisson (1981) density, which meets the UNESCO check values', () => {
		// UNESCO (1983) check values at 5 °C, 0 dbar: 999.96675 kg/m³ (S = 0) and 1027.67547 kg/m³
		// (S = 35) — from memory, as reproduced by open EOS-80 implementations.
		expect(computeWaterDensityKgPerL(5, 0) * 1000).toBeCloseTo(999.96675, 2);
		expect(computeWaterDensityKgPerL(5, 35) * 1000).toBeCloseTo(1027.67547, 2);
	});
});

describe('oxygen transfer and uptake', () => {
	it('computes the maximum OTR kLa·(C* − C_set), worked by hand', () => {
		// 200 h⁻¹ × (6.727 − 2.0) mg/L = 945.4 mg/(L·h) = 29.55 mmol/(L·h)
		const otr = computeMaxOtr({ kLaPerH: 200, saturationMgPerL: 6.727, setpointMgPerL: 2 });
		expect(otr.mgPerLH).toBeCloseTo(945.4, 6);
		expect(otr.mmolPerLH).toBeCloseTo(945.4 / 31.998, 6);
	});

	it('computes OUR = (μ/Yx/O2 + m_O)·X, worked by hand', () => {
		// (0.5 h⁻¹ / 1.0 g/g + 0.01 g/(g·h)) × 20 g/L = 10.2 g/(L·h) = 10200 mg/(L·h) = 318.77 mmol/(L·h)
		const our = computeOxygenUptakeRate({
			specificGrowthRatePerH: 0.5,
			biomassGPerL: 20,
			yieldBiomassOnOxygenGPerG: 1,
			maintenanceGO2PerGH: 0.01
		});
		expect(our.mgPerLH).toBeCloseTo(10200, 6);
		expect(our.mmolPerLH).toBeCloseTo(10200 / 31.998, 6);
	});

	it('holds only seconds of oxygen at a high-density uptake rate', () => {
		// Common practice: C*/OUR ≈ 0.2 mmol/L ÷ 100 mmol/(L·h) ≈ 7 s. By hand at 37 °C, 100 % air:
		// 0.2102 mmol/L ÷ 100 mmol/(L·h) × 3600 s/h = 7.57 s.
		const reserve = computeOxygenReserveS({ setpointMgPerL: 6.727, ourMmolPerLH: 100 });
		expect(reserve).toBeCloseTo((6.727 / 31.998 / 100) * 3600, 6);
		expect(reserve).toBeGreaterThan(5);
		expect(reserve).toBeLessThan(10);
	});

	it('finds a dense bacterial culture short of oxygen on air, and beyond what enrichment can fix', () => {
		// qO2 ≈ 15 mmol/(g·h) at full respiration (Andersen & von Meyenburg 1980) × 30 g/L = 450 mmol/(L·h);
		// kLa 300 h⁻¹, top of the bench range (Badino et al. 2000). By hand, 37 °C, 30 % air:
		// C_set = 0.3 × 6.727 = 2.018 mg/L; max OTR = 300 × (6.727 − 2.018) = 1412.7 mg/(L·h) = 44.1 mmol/(L·h).
		// x needed = 0.20946 × (2.018 + 450 × 31.998 / 300) / 6.727 = 0.20946 × 50.01 / 6.727 ≈ 1.557 > 1.
		const r = assessOxygenTransfer({
			conditions: { temperatureC: 37 },
			kLaPerH: 300,
			setpoint: { percentAirSaturation: 30 },
			uptake: { ourMmolPerLH: 450 }
		});
		expect(r.setpointMgPerL).toBeCloseTo(0.3 * 6.727, 3);
		expect(r.maxOtr.mmolPerLH).toBeCloseTo((300 * 0.7 * 6.727) / 31.998, 1);
		expect(r.verdict).toBe('insufficient');
		expect(r.utilisation).toBeGreaterThan(1);
		expect(r.kLaNeededPerH).toBeCloseTo((450 * 31.998) / (0.7 * 6.727), -1);
		expect(r.o2MoleFractionNeeded).toBeCloseTo(1.557, 2);
		expect(r.enrichmentFeasible).toBe(false);
	});

	it('finds a CHO-type culture short on air at low kLa but rescued by O2 enrichment', () => {
		// qO2 ≈ 2.7e-13 mol/(cell·h) (Ducommun et al. 2000) × 1e7 cells/mL = 2.7 mmol/(L·h);
		// kLa 10 h⁻¹ (cell-culture vessels 1–20 h⁻¹, from memory); 37 °C, 40 % air setpoint.
		// By hand: C_set = 0.4 × 6.727 = 2.691 mg/L; max OTR on air = 10 × 4.036 = 40.36 mg/(L·h) = 1.261
		// mmol/(L·h) < 2.7. x = 0.20946 × (2.691 + 2.7 × 31.998 / 10) / 6.727 = 0.20946 × 11.33 / 6.727 = 0.353.
		const r = assessOxygenTransfer({
			conditions: { temperatureC: 37 },
			kLaPerH: 10,
			setpoint: { percentAirSaturation: 40 },
			uptake: { ourMmolPerLH: 2.7 }
		});
		expect(r.verdict).toBe('insufficient');
		expect(r.maxOtr.mmolPerLH).toBeCloseTo(1.261, 2);
		expect(r.o2MoleFractionNeeded).toBeCloseTo(0.353, 2);
		expect(r.enrichmentFeasible).toBe(true);
		const enriched = assessOxygenTransfer({
			conditions: { temperatureC: 37, o2MoleFraction: r.o2MoleFractionNeeded * 1.05 },
			kLaPerH: 10,
			setpoint: { percentAirSaturation: 40 },
			uptake: { ourMmolPerLH: 2.7 }
		});
		expect(enriched.verdict).toBe('sufficient');
	});

	it('accepts growth parameters for the peak uptake and a setpoint in mg/L', () => {
		const r = assessOxygenTransfer({
			conditions: { temperatureC: 30 },
			kLaPerH: 500,
			setpoint: { mgPerL: 2 },
			uptake: { specificGrowthRatePerH: 0.3, biomassGPerL: 10, yieldBiomassOnOxygenGPerG: 1.2 }
		});
		// OUR = 0.3 / 1.2 × 10 = 2.5 g/(L·h) = 2500 mg/(L·h); max OTR = 500 × (7.559 − 2) ≈ 2779 mg/(L·h)
		expect(r.peakOur.mgPerLH).toBeCloseTo(2500, 6);
		expect(r.verdict).toBe('sufficient');
		expect(r.reserveS).toBeCloseTo((2 / 31.998 / (2500 / 31.998)) * 3600, 6);
	});

	it('refuses a setpoint at or above saturation, naming the setpoint field', () => {
		const e = errorOf(() =>
			assessOxygenTransfer({
				conditions: { temperatureC: 37 },
				kLaPerH: 100,
				setpoint: { percentAirSaturation: 100 },
				uptake: { ourMmolPerLH: 10 }
			})
		);
		expect(e.field).toBe('setpoint');
		const t = errorOf(() =>
			assessOxygenTransfer({
				conditions: { temperatureC: 60 },
				kLaPerH: 100,
				setpoint: { percentAirSaturation: 30 },
				uptake: { ourMmolPerLH: 10 }
			})
		);
		expect(t.field).toBe('conditions.temperatureC');
	});

	it('computes the O2 a run needs from Yx/O2, worked by hand', () => {
		// Yx/O2 = 0.721 g/g (Shuler & Kargi worked balance) → 1/0.721 = 1.3870 g O2 per g biomass;
		// 50 g/L formed in 10 L → 693.5 g O2 = 21.67 mol.
		const d = computeOxygenDemand({
			yieldBiomassOnOxygenGPerG: 0.721,
			biomassProducedGPerL: 50,
			workingVolumeL: 10
		});
		expect(d.oxygenPerBiomassGPerG).toBeCloseTo(1.387, 3);
		expect(d.totalG).toBeCloseTo(693.48, 1);
		expect(d.totalMol).toBeCloseTo(693.48 / 31.998, 2);
	});

	it('shows the warm-broth rule of thumb: 100 % DO is roughly 6–7 mg/L', () => {
		// Common practice (chemistry/REFERENCES.md).
		const r = computeOxygenSaturation({ temperatureC: 37 });
		expect(r.mgPerL).toBeGreaterThan(6);
		expect(r.mgPerL).toBeLessThan(7);
	});
});
