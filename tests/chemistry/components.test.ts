import { describe, expect, it } from 'vitest';
import { MF } from 'mf-parser';
import {
	type ComponentSpec,
	REFERENCE_COMPONENTS,
	elementsPerGram,
	findHydratesOf,
	findReferenceComponent,
	ionBase,
	resolveComponent,
	solubilityAt
} from '../../chemistry/components';
import { GHS_STATEMENTS } from '../../chemistry/data/components';
import { parseFormula } from '../../chemistry/formula';
import { errorOf } from './input-error';

function component(id: string) {
	const found = findReferenceComponent(id);
	if (!found) throw new Error(`no reference component ${id}`);
	return found;
}

// CAS Registry Numbers end in a check digit: Σ (position from the right × digit) mod 10
// (CAS Registry Number format, as published by the Chemical Abstracts Service).
function hasValidCasCheckDigit(cas: string): boolean {
	const match = /^(\d{2,7})-(\d{2})-(\d)$/.exec(cas);
	if (!match) return false;
	const digits = (match[1] + match[2]).split('').reverse();
	const sum = digits.reduce((s, d, i) => s + Number(d) * (i + 1), 0);
	return sum % 10 === Number(match[3]);
}

function toMfParserSyntax(formula: string): string {
	return parseFormula(formula)
		.parts.map(
			(p) =>
				`${p.multiplier === 1 ? '' : p.multiplier}${p.formula.replace(/\[/g, '(').replace(/\]/g, ')')}`
		)
		.join(' . ');
}

describe('reference components', () => {
	it('has at least 80 entries with unique kebab-case ids', () => {
		expect(REFERENCE_COMPONENTS.length).toBeGreaterThanOrEqual(80);
		const ids = REFERENCE_COMPONENTS.map((c) => c.id);
		expect(new Set(ids).size).toBe(ids.length);
		for (const id of ids) expect(id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
	});

	it('covers the 20 proteinogenic L-amino acids and L-cystine', () => {
		const names = [
			'alanine',
			'arginine',
			'asparagine',
			'aspartic-acid',
			'cysteine',
			'glutamine',
			'glutamic-acid',
			'histidine',
			'isoleucine',
			'leucine',
			'lysine',
			'methionine',
			'phenylalanine',
			'proline',
			'serine',
			'threonine',
			'tryptophan',
			'tyrosine',
			'valine',
			'cystine'
		];
		for (const name of names)
			expect(findReferenceComponent(`l-${name}`)?.category).toBe('amino-acid');
		expect(findReferenceComponent('glycine')?.category).toBe('amino-acid');
	});

	it('gives every CAS number a valid check digit', () => {
		const withCas = REFERENCE_COMPONENTS.filter((c) => c.casNumber);
		expect(withCas.length).toBeGreaterThan(100);
		for (const c of withCas)
			expect(hasValidCasCheckDigit(c.casNumber as string), `${c.id} ${c.casNumber}`).toBe(true);
	});

	it('computes every molar mass from the formula, agreeing with mf-parser (independent library)', () => {
		const withFormula = REFERENCE_COMPONENTS.filter((c) => c.formula);
		expect(withFormula.length).toBeGreaterThan(100);
		for (const c of withFormula) {
			const theirs = new MF(toMfParserSyntax(c.formula as string)).getInfo().mass as number;
			const elements = parseFormula(c.formula as string).elements;
			// NIST-based masses differ from IUPAC for Se and Mo by up to 0.012 g/mol per atom (chemistry/REFERENCES.md).
			const heavy = (elements.Se ?? 0) + (elements.Mo ?? 0);
			const tolerance = heavy > 0 ? 0.012 * heavy : 1e-4 * theirs;
			expect(Math.abs((c.molarMassGPerMol as number) - theirs), c.id).toBeLessThan(tolerance);
		}
	});

	it.each([
		// Derived from IUPAC 2021 standard atomic weights (chemistry/REFERENCES.md, "D").
		['d-glucose', 180.156],
		['glycerol', 92.094],
		['sodium-chloride', 58.44],
		['potassium-dihydrogen-phosphate', 136.084],
		['magnesium-sulfate-heptahydrate', 246.466],
		['calcium-chloride-dihydrate', 147.008],
		['ammonium-sulfate', 132.134]
	])('%s has molar mass %d g/mol (derived from IUPAC 2021)', (id, expected) => {
		expect(component(id).molarMassGPerMol).toBeCloseTo(expected, 3);
	});

	it('uses the published osmotic coefficients (37 °C, chemistry/REFERENCES.md)', () => {
		const published: [string, number][] = [
			['sodium-chloride', 0.93],
			['potassium-chloride', 0.92],
			['sodium-bicarbonate', 0.96],
			['potassium-dihydrogen-phosphate', 0.87],
			['calcium-chloride', 0.86],
			['magnesium-chloride', 0.89],
			['magnesium-sulfate', 0.58],
			['sodium-sulfate', 0.74],
			['d-glucose', 1.01],
			['sucrose', 1.02]
		];
		for (const [id, phi] of published) {
			expect(component(id).osmoticCoefficient).toBe(phi);
			expect(component(id).osmoticCoefficientSource).toMatch(/published/);
		}
		for (const c of REFERENCE_COMPONENTS)
			expect(c.osmoticCoefficientSource.length, c.id).toBeGreaterThan(10);
	});

	it('makes every electrolyte neutral', () => {
		for (const c of REFERENCE_COMPONENTS) {
			const net = (c.ions ?? []).reduce((sum, i) => sum + i.count * i.charge, 0);
			expect(net, c.id).toBe(0);
			expect(() => resolveComponent(c)).not.toThrow();
		}
	});

	it('lets inorganic ions add up to the formula less its water of crystallisation', () => {
		let checked = 0;
		for (const c of REFERENCE_COMPONENTS) {
			if (!c.formula || !c.ions || !['salt', 'trace-metal'].includes(c.category)) continue;
			let fromIons: Record<string, number>;
			try {
				fromIons = {};
				for (const ion of c.ions) {
					for (const [s, n] of Object.entries(parseFormula(ionBase(ion.ion)).elements)) {
						fromIons[s] = (fromIons[s] ?? 0) + n * ion.count;
					}
				}
			} catch {
				continue; // organic ion labels such as citrate^3- are names, not formulas
			}
			const parts = parseFormula(c.formula).parts.filter((p) => p.formula !== 'H2O');
			const expected: Record<string, number> = {};
			for (const p of parts) {
				for (const [s, n] of Object.entries(parseFormula(p.formula).elements))
					expected[s] = (expected[s] ?? 0) + n * p.multiplier;
			}
			expect(fromIons, c.id).toEqual(expected);
			checked++;
		}
		expect(checked).toBeGreaterThanOrEqual(35);
	});

	it('links hydrates to an anhydrous form with the same formula apart from water', () => {
		const hydrates = REFERENCE_COMPONENTS.filter((c) => c.anhydrousId);
		expect(hydrates.length).toBeGreaterThanOrEqual(15);
		for (const h of hydrates) {
			const anhydrous = component(h.anhydrousId as string);
			const waterless = parseFormula(h.formula as string).parts.filter((p) => p.formula !== 'H2O');
			expect(waterless.map((p) => p.formula).join('·'), h.id).toBe(
				parseFormula(anhydrous.formula as string).reading
			);
			expect(h.molarMassGPerMol as number).toBeGreaterThan(anhydrous.molarMassGPerMol as number);
		}
		expect(findHydratesOf('magnesium-sulfate').map((c) => c.id)).toEqual([
			'magnesium-sulfate-heptahydrate'
		]);
		expect(findHydratesOf('disodium-hydrogen-phosphate')).toHaveLength(3);
	});

	it('links salt forms to a free form contained in them', () => {
		const saltForms = REFERENCE_COMPONENTS.filter((c) => c.freeFormId);
		expect(saltForms.length).toBeGreaterThanOrEqual(8);
		for (const s of saltForms) {
			const free = component(s.freeFormId as string);
			const saltElements = parseFormula(s.formula as string).elements;
			for (const [symbol, n] of Object.entries(parseFormula(free.formula as string).elements)) {
				if (symbol === 'H') continue; // deprotonated salts (disodium tyrosinate) carry fewer H
				expect(saltElements[symbol], `${s.id} ${symbol}`).toBeGreaterThanOrEqual(n);
			}
		}
	});

	it('shares the anhydrous solubility with hydrates, on the anhydrous basis', () => {
		const heptahydrate = component('magnesium-sulfate-heptahydrate');
		expect(heptahydrate.solubility?.basisFormula).toBe('MgSO4');
		expect(heptahydrate.solubility?.points).toEqual(
			component('magnesium-sulfate').solubility?.points
		);
	});

	it.each([
		// Values quoted in the task brief; CRC Handbook amino-acid table / common handbook values, from memory.
		['l-tyrosine', 0.45, 0.01],
		['l-cystine', 0.11, 0.01],
		['l-leucine', 22, 1],
		['d-glucose', 909, 1]
	])('records the 25 °C solubility of %s as about %d g/L (from memory)', (id, gPerL, tolerance) => {
		const c = component(id);
		expect(Math.abs((c.solubilityGPerL25C as number) - gPerL)).toBeLessThanOrEqual(tolerance);
		expect(c.solubilitySource).toMatch(/from memory/);
	});

	it('names a source for every solubility and hazard list', () => {
		for (const c of REFERENCE_COMPONENTS) {
			if (c.solubility) expect(c.solubility.source, c.id).toBeTruthy();
			if (c.ghsHazards) {
				expect(c.hazardSource).toBe('from memory; check the supplier SDS');
				for (const h of c.ghsHazards) expect(h.text).toBe(GHS_STATEMENTS[h.code]);
			}
		}
		expect(component('boric-acid').ghsHazards?.map((h) => h.code)).toContain('H360FD');
	});

	it('describes complex materials by mass fractions that add up to at most 1 g/g', () => {
		const complex = REFERENCE_COMPONENTS.filter((c) => c.category === 'complex');
		expect(complex.length).toBeGreaterThanOrEqual(4);
		for (const c of complex) {
			expect(c.formula).toBeNull();
			expect(c.fractionsNote).toMatch(/replace with the lot's certificate values/);
			const sum = Object.values(c.elementalMassFractions ?? {}).reduce((a, b) => a + b, 0);
			expect(sum).toBeGreaterThan(0);
			expect(sum).toBeLessThanOrEqual(1);
		}
	});
});

describe('findReferenceComponent', () => {
	it('finds by id, name, synonym and unshared formula, ignoring case and punctuation', () => {
		expect(findReferenceComponent('sodium-chloride')?.formula).toBe('NaCl');
		expect(findReferenceComponent('Sodium Chloride')?.id).toBe('sodium-chloride');
		expect(findReferenceComponent('dextrose')?.id).toBe('d-glucose');
		expect(findReferenceComponent('MgSO4·7H2O')?.id).toBe('magnesium-sulfate-heptahydrate');
		expect(findReferenceComponent('KH2PO4')?.id).toBe('potassium-dihydrogen-phosphate');
	});

	it('does not guess between components sharing a formula', () => {
		expect(findReferenceComponent('C6H12O6')).toBeUndefined();
		expect(findReferenceComponent('no such thing')).toBeUndefined();
	});
});

describe('resolveComponent and elementsPerGram', () => {
	it('gives g element per g from the formula (IUPAC 2021: C 12.011, H 1.008, O 15.999)', () => {
		const perGram = elementsPerGram(component('d-glucose'));
		expect(perGram.C).toBeCloseTo((6 * 12.011) / 180.156, 6);
		expect(perGram.H).toBeCloseTo((12 * 1.008) / 180.156, 6);
		expect(perGram.O).toBeCloseTo((6 * 15.999) / 180.156, 6);
	});

	it('derives particles per unit and ionic strength per mol/L from the ions', () => {
		const na2so4 = resolveComponent(component('sodium-sulfate'));
		expect(na2so4.particlesPerUnit).toBe(3);
		expect(na2so4.ionicStrengthPerMolar).toBe(0.5 * (2 * 1 + 1 * 4)); // ½ Σ n z², by hand
		expect(resolveComponent(component('d-glucose')).particlesPerUnit).toBe(1);
		expect(resolveComponent(component('yeast-extract')).particlesPerUnit).toBeNull();
	});

	it('accepts a component stored by the app', () => {
		const spec: ComponentSpec = {
			id: 'db-123',
			name: 'House trace mix salt',
			formula: 'ZnCl2',
			ions: [
				{ ion: 'Zn^2+', count: 1, charge: 2 },
				{ ion: 'Cl-', count: 2, charge: -1 }
			]
		};
		const resolved = resolveComponent(spec);
		expect(resolved.molarMassGPerMol).toBeCloseTo(65.38 + 2 * 35.45, 6); // IUPAC 2021
		expect(resolved.osmoticCoefficientSource).toMatch(/assumed ideal/);
	});

	it.each<[string, ComponentSpec, string, number | undefined]>([
		['a bad formula', { id: 'x', name: 'X', formula: 'NaXq' }, 'component.formula', 2],
		[
			'a formula and fractions',
			{ id: 'x', name: 'X', formula: 'NaCl', elementalMassFractions: { C: 0.1 } },
			'component.elementalMassFractions',
			undefined
		],
		[
			'fractions above 1',
			{ id: 'x', name: 'X', elementalMassFractions: { C: 0.7, O: 0.5 } },
			'component.elementalMassFractions',
			undefined
		],
		[
			'a negative fraction',
			{ id: 'x', name: 'X', elementalMassFractions: { C: -0.1 } },
			'component.elementalMassFractions.C',
			undefined
		],
		[
			'an unknown element',
			{ id: 'x', name: 'X', elementalMassFractions: { Qq: 0.1 } },
			'component.elementalMassFractions.Qq',
			undefined
		],
		[
			'charged ions',
			{ id: 'x', name: 'X', formula: 'NaCl', ions: [{ ion: 'Na+', count: 1, charge: 1 }] },
			'component.ions',
			undefined
		],
		[
			'ions without a molar mass',
			{
				id: 'x',
				name: 'X',
				ions: [
					{ ion: 'Na+', count: 1, charge: 1 },
					{ ion: 'Cl-', count: 1, charge: -1 }
				]
			},
			'component.ions',
			undefined
		],
		[
			'a fractional charge',
			{
				id: 'x',
				name: 'X',
				formula: 'NaCl',
				ions: [
					{ ion: 'Na+', count: 1, charge: 0.5 },
					{ ion: 'Cl-', count: 0.5, charge: -1 }
				]
			},
			'component.ions.0.charge',
			undefined
		],
		[
			'a NaN osmotic coefficient',
			{ id: 'x', name: 'X', formula: 'NaCl', osmoticCoefficient: Number.NaN },
			'component.osmoticCoefficient',
			undefined
		],
		[
			'a molar mass that contradicts the formula',
			{ id: 'x', name: 'X', formula: 'NaCl', molarMassGPerMol: 100 },
			'component.molarMassGPerMol',
			undefined
		],
		['no id', { id: '', name: 'X' }, 'component.id', undefined],
		[
			'a zero solubility',
			{
				id: 'x',
				name: 'X',
				formula: 'NaCl',
				solubility: { points: [{ temperatureC: 25, gPerL: 0 }] }
			},
			'component.solubility.points.0.gPerL',
			undefined
		]
	])('rejects %s with a field path', (_what, spec, field, position) => {
		const error = errorOf(() => resolveComponent(spec));
		expect(error.field).toBe(field);
		expect(error.position).toBe(position);
	});
});

describe('solubilityAt', () => {
	const points = [
		{ temperatureC: 0, gPerL: 1 },
		{ temperatureC: 100, gPerL: Math.E }
	];

	it('returns a sourced point exactly', () => {
		expect(solubilityAt(points, 100)).toEqual({ gPerL: Math.E, exact: true, withinRange: true });
	});

	it('interpolates ln S linearly in 1/T (van ’t Hoff form)', () => {
		// Where 1/T lies midway between 1/273.15 K and 1/373.15 K, ln S lies midway between 0 and 1.
		const midKelvin = 2 / (1 / 273.15 + 1 / 373.15);
		const result = solubilityAt(points, midKelvin - 273.15);
		expect(result.gPerL).toBeCloseTo(Math.exp(0.5), 9);
		expect(result.withinRange).toBe(true);
	});

	it('uses the nearest point outside the sourced range and says so', () => {
		expect(solubilityAt(points, -5)).toEqual({ gPerL: 1, exact: false, withinRange: false });
		expect(solubilityAt(points, 120).withinRange).toBe(false);
	});
});
