import { setSiteDecimalMark } from '$lib/number-reading';
import { describe, expect, it } from 'vitest';
import { checkTolerance, readLineAmount } from '$lib/batches';
import { scaleComponentLine, scaleStockLine } from '$lib/server/batches/scaling';

// Molar masses worked by hand from IUPAC 2021 standard atomic weights (Prohaska et al., Pure Appl.
// Chem. 94:573, 2022; conventional values for Mg, S, O, H): MgSO4 = 24.305 + 32.06 + 4 × 15.999 = 120.361;
// MgSO4·7H2O = 120.361 + 7 × 18.015 = 246.466 (as derived in chemistry/REFERENCES.md); NaCl 58.440.
const NaCl = { name: 'Sodium chloride', formula: 'NaCl', molarMassGPerMol: null };
const MgSO4 = { name: 'Magnesium sulfate', formula: 'MgSO4', molarMassGPerMol: null };
const MgSO4_7H2O = {
	name: 'Magnesium sulfate heptahydrate',
	formula: 'MgSO4·7H2O',
	molarMassGPerMol: null
};
const yeastExtract = { name: 'Yeast extract', formula: null, molarMassGPerMol: null };

describe('scaling a batch line (hand-worked)', () => {
	it('scales g/L by volume: 5.2 g/L × 2 L = 10.4 g', () => {
		expect(
			scaleComponentLine({ amount: 5.2, unit: 'g/L', component: NaCl }, 2, null).massG
		).toBeCloseTo(10.4, 10);
	});

	it('corrects for the lot assay and water: 10.4 g × 100/99.7 × 100/(100 − 0.1) = 10.4417… g', () => {
		const hand = 10.4 * (100 / 99.7) * (100 / 99.9);
		const result = scaleComponentLine({ amount: 5.2, unit: 'g/L', component: NaCl }, 2, {
			assayPercent: 99.7,
			waterContentPercent: 0.1
		});
		expect(result.massG).toBeCloseTo(hand, 9);
		expect(result.massG).toBeCloseTo(10.44177, 4);
	});

	it('converts a molar target on the anhydrous basis to the heptahydrate weighed: 2 mM × 2 L × 246.466 g/mol = 0.985864 g', () => {
		const result = scaleComponentLine(
			{ amount: 2, unit: 'mM', component: MgSO4, shelfForm: MgSO4_7H2O },
			2,
			null
		);
		expect(result.massG).toBeCloseTo(0.985864, 6);
		expect(result.factors.hydrate).toBeCloseTo(246.466 / 120.361, 6);
	});

	it('converts a mass target on the anhydrous basis: 0.09 g/L MgSO4 × 10 L → 0.9 × 246.466/120.361 g, then assay 99.2 %, water 0.5 %', () => {
		const hand = 0.9 * (246.466 / 120.361) * (100 / 99.2) * (100 / 99.5);
		const result = scaleComponentLine(
			{ amount: 0.09, unit: 'g/L', component: MgSO4, shelfForm: MgSO4_7H2O },
			10,
			{ assayPercent: 99.2, waterContentPercent: 0.5 }
		);
		expect(result.massG).toBeCloseTo(hand, 6);
		expect(result.massG).toBeCloseTo(1.867, 3);
	});

	it('scales a complex material with no formula by mass only', () => {
		expect(
			scaleComponentLine({ amount: 8, unit: 'g/L', component: yeastExtract }, 0.5, null).massG
		).toBeCloseTo(4, 10);
		expect(() =>
			scaleComponentLine({ amount: 8, unit: 'mM', component: yeastExtract }, 0.5, null)
		).toThrow(/Yeast extract/);
	});

	it('doses a stock by mL per litre: 1 mL/L × 2 L = 2 mL; 0.5 mL/L × 7.5 L = 3.75 mL', () => {
		expect(scaleStockLine(1, 2).volumeMl).toBe(2);
		expect(scaleStockLine(0.5, 7.5).volumeMl).toBeCloseTo(3.75, 12);
	});
});

describe('tolerance (±2 % is common practice)', () => {
	it('counts the edges as within and anything beyond as out', () => {
		expect(checkTolerance(10_000_000, 10_200_000, 2)).toBe('within');
		expect(checkTolerance(10_000_000, 9_800_000, 2)).toBe('within');
		expect(checkTolerance(10_000_000, 10_200_001, 2)).toBe('above');
		expect(checkTolerance(10_000_000, 9_799_999, 2)).toBe('below');
		// An edge typed in decimal: 1.02 × 12.5 g = 12.75 g exactly at +2 %.
		expect(checkTolerance(Math.round(12.5e6), Math.round(12.75 * 1e6), 2)).toBe('within');
		expect(checkTolerance(1000, 1000, 0)).toBe('within');
		expect(checkTolerance(1000, 1001, 0)).toBe('above');
	});
});

describe('reading what a technician typed for a line', () => {
	it('reads units, keeps µg (component) or µL (stock), and refuses what is ambiguous or of the wrong kind', () => {
		expect(readLineAmount('12,5', 'component')).toMatchObject({
			ok: false,
			message:
				'Mass: “12,5” has a decimal comma, but this site writes decimals with a point: type 12.5.'
		});
		setSiteDecimalMark('comma');
		try {
			expect(readLineAmount('12,5', 'component')).toMatchObject({
				ok: true,
				quantity: 12_500_000,
				readAs: '12,5 g'
			});
		} finally {
			setSiteDecimalMark('point');
		}
		expect(readLineAmount(' 12.5 g ', 'component')).toMatchObject({
			ok: true,
			quantity: 12_500_000
		});
		expect(readLineAmount('350 mg', 'component')).toMatchObject({ ok: true, quantity: 350_000 });
		expect(readLineAmount('1.2kg', 'component')).toMatchObject({
			ok: true,
			quantity: 1_200_000_000
		});
		// The sheet's own text reads back as shown: three decimals after a point are a balance reading.
		expect(readLineAmount('7.502 g', 'component')).toMatchObject({ ok: true, quantity: 7_502_000 });
		expect(readLineAmount('1,250', 'component')).toMatchObject({
			ok: false,
			message:
				'Mass: “1,250” is ambiguous: it could be 1.25 or 1250. This site writes decimals with a point and no thousands separator: type 1250 or 1.25.'
		});
		expect(readLineAmount('12.5 mL', 'component')).toMatchObject({
			ok: false,
			message: 'Mass: “mL” is not a mass unit here: use g, mg, kg, µg.'
		});
		expect(readLineAmount('twelve', 'component')).toMatchObject({ ok: false });
		expect(readLineAmount('1.2.3', 'component')).toMatchObject({ ok: false });
		expect(readLineAmount('0', 'component')).toMatchObject({
			ok: false,
			message: 'Mass: the mass must be above zero.'
		});
		expect(readLineAmount('2.5', 'stock')).toMatchObject({ ok: true, quantity: 2_500 });
		expect(readLineAmount('250 µL', 'stock')).toMatchObject({ ok: true, quantity: 250 });
		expect(readLineAmount('2 g', 'stock')).toMatchObject({
			ok: false,
			message: 'Volume: “g” is not a volume unit here: use mL, L, µL.'
		});
	});
});
