/**
 * Reference components for culture media. Molar masses are not typed here: they are computed from
 * the formula with IUPAC 2021 weights when the table loads (chemistry/components.ts).
 *
 * Sources, per field:
 * - osmoticCoefficient: the osmotic coefficients at physiological concentration, 37 °C, for NaCl, KCl,
 *   NaHCO3, KH2PO4, CaCl2, MgCl2, MgSO4, Na2SO4, glucose and sucrose collected (as confirmed
 *   published values) in chemistry/REFERENCES.md. Other salts borrow the value of a salt
 *   of the same charge type and say so; non-electrolytes without a value are assumed ideal (φ = 1).
 * - solubility: grams of the stated basis form per litre of water at 25 °C, read from the CRC Handbook
 *   of Chemistry and Physics tables ("Aqueous Solubility of Inorganic Compounds", mass % converted;
 *   "Properties of Amino Acids") or the Merck Index ("1 g dissolves in … mL"), all recalled from memory
 *   and marked so: confirm before relying on a value. A warning threshold, not a phase diagram.
 * - ghsHazards: recalled from memory; the supplier's safety data sheet is authoritative.
 * - elementalMassFractions of complex materials: typical values from memory; replace them with the
 *   lot's certificate of analysis.
 * - casNumber: recalled from memory; each passes the CAS check digit (tested).
 */
import type { ComponentCategory, GhsHazard, IonSpec, SolubilityPoint } from '../components';

export interface ReferenceComponentData {
	id: string;
	name: string;
	category: ComponentCategory;
	formula?: string;
	casNumber?: string;
	synonyms?: string[];
	ions?: IonSpec[];
	osmoticCoefficient: number;
	osmoticCoefficientSource: string;
	/** g of the basis form (`solubilityBasisFormula`, default this form) per litre of water at 25 °C. */
	solubilityGPerL25C?: number;
	/** Further points for the temperature dependence, same basis. */
	solubilityPoints?: SolubilityPoint[];
	solubilityBasisFormula?: string;
	solubilitySource?: string;
	anhydrousId?: string;
	/** The free acid/base form of a salt form (L-lysine for L-lysine·HCl). */
	freeFormId?: string;
	ghsHazards?: GhsHazard[];
	elementalMassFractions?: Record<string, number>;
	fractionsNote?: string;
	fractionsSource?: string;
}

/** GHS hazard statement texts (UN GHS, Annex 3). */
export const GHS_STATEMENTS: Readonly<Record<string, string>> = Object.freeze({
	H272: 'May intensify fire; oxidiser',
	H290: 'May be corrosive to metals',
	H300: 'Fatal if swallowed',
	H301: 'Toxic if swallowed',
	H302: 'Harmful if swallowed',
	H314: 'Causes severe skin burns and eye damage',
	H315: 'Causes skin irritation',
	H317: 'May cause an allergic skin reaction',
	H318: 'Causes serious eye damage',
	H319: 'Causes serious eye irritation',
	H331: 'Toxic if inhaled',
	H332: 'Harmful if inhaled',
	H334: 'May cause allergy or asthma symptoms or breathing difficulties if inhaled',
	H335: 'May cause respiratory irritation',
	H341: 'Suspected of causing genetic defects',
	H350i: 'May cause cancer by inhalation',
	H360D: 'May damage the unborn child',
	H360F: 'May damage fertility',
	H360FD: 'May damage fertility. May damage the unborn child',
	H372: 'Causes damage to organs through prolonged or repeated exposure',
	H373: 'May cause damage to organs through prolonged or repeated exposure',
	H410: 'Very toxic to aquatic life with long lasting effects',
	H411: 'Toxic to aquatic life with long lasting effects'
});

export const HAZARD_SOURCE = 'from memory; check the supplier SDS';

/** Osmotic coefficients at physiological concentration, 37 °C (chemistry/REFERENCES.md, confirmed). */
export const OSMOTIC_COEFFICIENTS_37C: Readonly<Record<string, number>> = Object.freeze({
	NaCl: 0.93,
	KCl: 0.92,
	NaHCO3: 0.96,
	KH2PO4: 0.87,
	CaCl2: 0.86,
	MgCl2: 0.89,
	MgSO4: 0.58,
	Na2SO4: 0.74,
	glucose: 1.01,
	sucrose: 1.02
});

const PHI_SOURCE =
	'published osmotic coefficient at physiological concentration, 37 °C (chemistry/REFERENCES.md)';
const IDEAL_SOURCE = 'assumed ideal (φ = 1): no sourced value';

function phi(of: keyof typeof OSMOTIC_COEFFICIENTS_37C) {
	return {
		osmoticCoefficient: OSMOTIC_COEFFICIENTS_37C[of],
		osmoticCoefficientSource: `${of}: ${PHI_SOURCE}`
	};
}
function phiLike(of: keyof typeof OSMOTIC_COEFFICIENTS_37C) {
	return {
		osmoticCoefficient: OSMOTIC_COEFFICIENTS_37C[of],
		osmoticCoefficientSource: `by analogy with ${of} (same charge type); not measured for this compound`
	};
}
const ideal = { osmoticCoefficient: 1, osmoticCoefficientSource: IDEAL_SOURCE };
const idealElectrolyte = {
	osmoticCoefficient: 1,
	osmoticCoefficientSource:
		'assumed ideal (φ = 1): no sourced value for this charge type, so the estimate runs high'
};

/** An ion label such as 'Na+', 'HPO4^2-'; the charge is read from the label. */
function ion(label: string, count = 1): IonSpec {
	const match = /^(.+?)(?:\^(\d+))?([+-])$/.exec(label);
	if (!match) throw new Error(`bad ion label ${label}`);
	const magnitude = match[2] ? Number(match[2]) : 1;
	return { ion: label, count, charge: match[3] === '+' ? magnitude : -magnitude };
}

function hazards(...codes: string[]): GhsHazard[] {
	return codes.map((code) => {
		const text = GHS_STATEMENTS[code];
		if (!text) throw new Error(`unknown GHS code ${code}`);
		return { code, text };
	});
}

const CRC_INORGANIC =
	'CRC Handbook of Chemistry and Physics, Aqueous Solubility of Inorganic Compounds (mass % converted to g per L water); from memory';
const CRC_AMINO =
	'CRC Handbook of Chemistry and Physics, Properties of Amino Acids (g per kg water); from memory';
const MERCK = 'Merck Index ("1 g dissolves in … mL water"), converted; from memory';
const SUGAR = 'CRC Handbook of Chemistry and Physics / Merck Index; from memory';
const FRACTIONS_NOTE = "typical: replace with the lot's certificate values";

export const REFERENCE_COMPONENT_DATA: readonly ReferenceComponentData[] = [
	// ---- salts ----
	{
		id: 'sodium-chloride',
		name: 'Sodium chloride',
		category: 'salt',
		formula: 'NaCl',
		casNumber: '7647-14-5',
		ions: [ion('Na+'), ion('Cl-')],
		...phi('NaCl'),
		solubilityGPerL25C: 360,
		solubilityPoints: [
			{ temperatureC: 0, gPerL: 357 },
			{ temperatureC: 100, gPerL: 392 }
		],
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'potassium-chloride',
		name: 'Potassium chloride',
		category: 'salt',
		formula: 'KCl',
		casNumber: '7447-40-7',
		ions: [ion('K+'), ion('Cl-')],
		...phi('KCl'),
		solubilityGPerL25C: 355,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'potassium-dihydrogen-phosphate',
		name: 'Potassium dihydrogen phosphate',
		synonyms: ['monopotassium phosphate', 'KH2PO4'],
		category: 'salt',
		formula: 'KH2PO4',
		casNumber: '7778-77-0',
		ions: [ion('K+'), ion('H2PO4-')],
		...phi('KH2PO4'),
		solubilityGPerL25C: 250,
		solubilityPoints: [{ temperatureC: 0, gPerL: 148 }],
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'dipotassium-hydrogen-phosphate',
		name: 'Dipotassium hydrogen phosphate',
		synonyms: ['dipotassium phosphate', 'K2HPO4'],
		category: 'salt',
		formula: 'K2HPO4',
		casNumber: '7758-11-4',
		ions: [ion('K+', 2), ion('HPO4^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 1680,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'disodium-hydrogen-phosphate',
		name: 'Disodium hydrogen phosphate, anhydrous',
		synonyms: ['Na2HPO4'],
		category: 'salt',
		formula: 'Na2HPO4',
		casNumber: '7558-79-4',
		ions: [ion('Na+', 2), ion('HPO4^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 118,
		solubilityPoints: [{ temperatureC: 0, gPerL: 17 }],
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'disodium-hydrogen-phosphate-dihydrate',
		name: 'Disodium hydrogen phosphate dihydrate',
		category: 'salt',
		formula: 'Na2HPO4·2H2O',
		casNumber: '10028-24-7',
		anhydrousId: 'disodium-hydrogen-phosphate',
		ions: [ion('Na+', 2), ion('HPO4^2-')],
		...phiLike('Na2SO4')
	},
	{
		id: 'disodium-hydrogen-phosphate-heptahydrate',
		name: 'Disodium hydrogen phosphate heptahydrate',
		category: 'salt',
		formula: 'Na2HPO4·7H2O',
		casNumber: '7782-85-6',
		anhydrousId: 'disodium-hydrogen-phosphate',
		ions: [ion('Na+', 2), ion('HPO4^2-')],
		...phiLike('Na2SO4')
	},
	{
		id: 'disodium-hydrogen-phosphate-dodecahydrate',
		name: 'Disodium hydrogen phosphate dodecahydrate',
		category: 'salt',
		formula: 'Na2HPO4·12H2O',
		casNumber: '10039-32-4',
		anhydrousId: 'disodium-hydrogen-phosphate',
		ions: [ion('Na+', 2), ion('HPO4^2-')],
		...phiLike('Na2SO4')
	},
	{
		id: 'sodium-dihydrogen-phosphate',
		name: 'Sodium dihydrogen phosphate, anhydrous',
		category: 'salt',
		formula: 'NaH2PO4',
		casNumber: '7558-80-7',
		ions: [ion('Na+'), ion('H2PO4-')],
		...phiLike('KH2PO4'),
		solubilityGPerL25C: 950,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'sodium-dihydrogen-phosphate-monohydrate',
		name: 'Sodium dihydrogen phosphate monohydrate',
		category: 'salt',
		formula: 'NaH2PO4·H2O',
		casNumber: '10049-21-5',
		anhydrousId: 'sodium-dihydrogen-phosphate',
		ions: [ion('Na+'), ion('H2PO4-')],
		...phiLike('KH2PO4')
	},
	{
		id: 'sodium-dihydrogen-phosphate-dihydrate',
		name: 'Sodium dihydrogen phosphate dihydrate',
		category: 'salt',
		formula: 'NaH2PO4·2H2O',
		casNumber: '13472-35-0',
		anhydrousId: 'sodium-dihydrogen-phosphate',
		ions: [ion('Na+'), ion('H2PO4-')],
		...phiLike('KH2PO4')
	},
	{
		id: 'ammonium-sulfate',
		name: 'Ammonium sulfate',
		category: 'salt',
		formula: '(NH4)2SO4',
		casNumber: '7783-20-2',
		ions: [ion('NH4+', 2), ion('SO4^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 764,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'ammonium-chloride',
		name: 'Ammonium chloride',
		category: 'salt',
		formula: 'NH4Cl',
		casNumber: '12125-02-9',
		ions: [ion('NH4+'), ion('Cl-')],
		...phiLike('KCl'),
		solubilityGPerL25C: 395,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H302', 'H319')
	},
	{
		id: 'magnesium-sulfate',
		name: 'Magnesium sulfate, anhydrous',
		category: 'salt',
		formula: 'MgSO4',
		casNumber: '7487-88-9',
		ions: [ion('Mg^2+'), ion('SO4^2-')],
		...phi('MgSO4'),
		solubilityGPerL25C: 357,
		solubilityPoints: [{ temperatureC: 0, gPerL: 220 }],
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'magnesium-sulfate-heptahydrate',
		name: 'Magnesium sulfate heptahydrate',
		synonyms: ['Epsom salt'],
		category: 'salt',
		formula: 'MgSO4·7H2O',
		casNumber: '10034-99-8',
		anhydrousId: 'magnesium-sulfate',
		ions: [ion('Mg^2+'), ion('SO4^2-')],
		...phi('MgSO4')
	},
	{
		id: 'magnesium-chloride',
		name: 'Magnesium chloride, anhydrous',
		category: 'salt',
		formula: 'MgCl2',
		casNumber: '7786-30-3',
		ions: [ion('Mg^2+'), ion('Cl-', 2)],
		...phi('MgCl2'),
		solubilityGPerL25C: 560,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'magnesium-chloride-hexahydrate',
		name: 'Magnesium chloride hexahydrate',
		category: 'salt',
		formula: 'MgCl2·6H2O',
		casNumber: '7791-18-6',
		anhydrousId: 'magnesium-chloride',
		ions: [ion('Mg^2+'), ion('Cl-', 2)],
		...phi('MgCl2')
	},
	{
		id: 'calcium-chloride',
		name: 'Calcium chloride, anhydrous',
		category: 'salt',
		formula: 'CaCl2',
		casNumber: '10043-52-4',
		ions: [ion('Ca^2+'), ion('Cl-', 2)],
		...phi('CaCl2'),
		solubilityGPerL25C: 813,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H319')
	},
	{
		id: 'calcium-chloride-dihydrate',
		name: 'Calcium chloride dihydrate',
		category: 'salt',
		formula: 'CaCl2·2H2O',
		casNumber: '10035-04-8',
		anhydrousId: 'calcium-chloride',
		ions: [ion('Ca^2+'), ion('Cl-', 2)],
		...phi('CaCl2'),
		ghsHazards: hazards('H319')
	},
	{
		id: 'sodium-bicarbonate',
		name: 'Sodium hydrogen carbonate',
		synonyms: ['sodium bicarbonate'],
		category: 'salt',
		formula: 'NaHCO3',
		casNumber: '144-55-8',
		ions: [ion('Na+'), ion('HCO3-')],
		...phi('NaHCO3'),
		solubilityGPerL25C: 103,
		solubilityPoints: [{ temperatureC: 0, gPerL: 69 }],
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'sodium-carbonate',
		name: 'Sodium carbonate, anhydrous',
		category: 'salt',
		formula: 'Na2CO3',
		casNumber: '497-19-8',
		ions: [ion('Na+', 2), ion('CO3^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 307,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H319')
	},
	{
		id: 'calcium-carbonate',
		name: 'Calcium carbonate',
		category: 'salt',
		formula: 'CaCO3',
		casNumber: '471-34-1',
		ions: [ion('Ca^2+'), ion('CO3^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 0.013,
		solubilitySource: 'CRC Handbook of Chemistry and Physics (calcite); from memory'
	},
	{
		id: 'potassium-nitrate',
		name: 'Potassium nitrate',
		category: 'salt',
		formula: 'KNO3',
		casNumber: '7757-79-1',
		ions: [ion('K+'), ion('NO3-')],
		...phiLike('KCl'),
		solubilityGPerL25C: 383,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H272')
	},
	{
		id: 'sodium-nitrate',
		name: 'Sodium nitrate',
		category: 'salt',
		formula: 'NaNO3',
		casNumber: '7631-99-4',
		ions: [ion('Na+'), ion('NO3-')],
		...phiLike('NaCl'),
		solubilityGPerL25C: 912,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H272')
	},
	{
		id: 'sodium-sulfate',
		name: 'Sodium sulfate, anhydrous',
		category: 'salt',
		formula: 'Na2SO4',
		casNumber: '7757-82-6',
		ions: [ion('Na+', 2), ion('SO4^2-')],
		...phi('Na2SO4'),
		solubilityGPerL25C: 281,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'potassium-sulfate',
		name: 'Potassium sulfate',
		category: 'salt',
		formula: 'K2SO4',
		casNumber: '7778-80-5',
		ions: [ion('K+', 2), ion('SO4^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 120,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'calcium-sulfate-dihydrate',
		name: 'Calcium sulfate dihydrate',
		synonyms: ['gypsum'],
		category: 'salt',
		formula: 'CaSO4·2H2O',
		casNumber: '10101-41-4',
		ions: [ion('Ca^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 2.05,
		solubilityBasisFormula: 'CaSO4',
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'calcium-nitrate-tetrahydrate',
		name: 'Calcium nitrate tetrahydrate',
		category: 'salt',
		formula: 'Ca(NO3)2·4H2O',
		casNumber: '13477-34-4',
		ions: [ion('Ca^2+'), ion('NO3-', 2)],
		...phiLike('CaCl2'),
		ghsHazards: hazards('H272', 'H302', 'H318')
	},
	{
		id: 'trisodium-citrate-dihydrate',
		name: 'Trisodium citrate dihydrate',
		synonyms: ['sodium citrate'],
		category: 'salt',
		formula: 'Na3C6H5O7·2H2O',
		casNumber: '6132-04-3',
		ions: [ion('Na+', 3), ion('citrate^3-')],
		...idealElectrolyte
	},
	{
		id: 'sodium-acetate',
		name: 'Sodium acetate, anhydrous',
		category: 'salt',
		formula: 'C2H3NaO2',
		casNumber: '127-09-3',
		ions: [ion('Na+'), ion('acetate-')],
		...phiLike('NaCl')
	},
	{
		id: 'sodium-acetate-trihydrate',
		name: 'Sodium acetate trihydrate',
		category: 'salt',
		formula: 'C2H3NaO2·3H2O',
		casNumber: '6131-90-4',
		anhydrousId: 'sodium-acetate',
		ions: [ion('Na+'), ion('acetate-')],
		...phiLike('NaCl')
	},
	{
		id: 'sodium-hydroxide',
		name: 'Sodium hydroxide',
		category: 'other',
		formula: 'NaOH',
		casNumber: '1310-73-2',
		ions: [ion('Na+'), ion('OH-')],
		...phiLike('NaCl'),
		ghsHazards: hazards('H290', 'H314')
	},

	// ---- trace metals ----
	{
		id: 'iron-ii-sulfate',
		name: 'Iron(II) sulfate, anhydrous',
		category: 'trace-metal',
		formula: 'FeSO4',
		casNumber: '7720-78-7',
		ions: [ion('Fe^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 295,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'iron-ii-sulfate-heptahydrate',
		name: 'Iron(II) sulfate heptahydrate',
		synonyms: ['ferrous sulfate heptahydrate'],
		category: 'trace-metal',
		formula: 'FeSO4·7H2O',
		casNumber: '7782-63-0',
		anhydrousId: 'iron-ii-sulfate',
		ions: [ion('Fe^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		ghsHazards: hazards('H302', 'H315', 'H319')
	},
	{
		id: 'iron-iii-chloride-hexahydrate',
		name: 'Iron(III) chloride hexahydrate',
		synonyms: ['ferric chloride hexahydrate'],
		category: 'trace-metal',
		formula: 'FeCl3·6H2O',
		casNumber: '10025-77-1',
		ions: [ion('Fe^3+'), ion('Cl-', 3)],
		...idealElectrolyte,
		solubilityGPerL25C: 912,
		solubilityBasisFormula: 'FeCl3',
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H290', 'H302', 'H315', 'H318')
	},
	{
		id: 'iron-iii-nitrate-nonahydrate',
		name: 'Iron(III) nitrate nonahydrate',
		category: 'trace-metal',
		formula: 'Fe(NO3)3·9H2O',
		casNumber: '7782-61-8',
		ions: [ion('Fe^3+'), ion('NO3-', 3)],
		...idealElectrolyte,
		ghsHazards: hazards('H272')
	},
	{
		id: 'zinc-sulfate',
		name: 'Zinc sulfate, anhydrous',
		category: 'trace-metal',
		formula: 'ZnSO4',
		casNumber: '7733-02-0',
		ions: [ion('Zn^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 577,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'zinc-sulfate-heptahydrate',
		name: 'Zinc sulfate heptahydrate',
		category: 'trace-metal',
		formula: 'ZnSO4·7H2O',
		casNumber: '7446-20-0',
		anhydrousId: 'zinc-sulfate',
		ions: [ion('Zn^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		ghsHazards: hazards('H302', 'H318', 'H410')
	},
	{
		id: 'manganese-ii-sulfate-monohydrate',
		name: 'Manganese(II) sulfate monohydrate',
		category: 'trace-metal',
		formula: 'MnSO4·H2O',
		casNumber: '10034-96-5',
		ions: [ion('Mn^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 637,
		solubilityBasisFormula: 'MnSO4',
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H373', 'H411')
	},
	{
		id: 'manganese-ii-chloride-tetrahydrate',
		name: 'Manganese(II) chloride tetrahydrate',
		category: 'trace-metal',
		formula: 'MnCl2·4H2O',
		casNumber: '13446-34-9',
		ions: [ion('Mn^2+'), ion('Cl-', 2)],
		...phiLike('MgCl2'),
		solubilityGPerL25C: 773,
		solubilityBasisFormula: 'MnCl2',
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'copper-ii-sulfate',
		name: 'Copper(II) sulfate, anhydrous',
		category: 'trace-metal',
		formula: 'CuSO4',
		casNumber: '7758-98-7',
		ions: [ion('Cu^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		solubilityGPerL25C: 220,
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'copper-ii-sulfate-pentahydrate',
		name: 'Copper(II) sulfate pentahydrate',
		category: 'trace-metal',
		formula: 'CuSO4·5H2O',
		casNumber: '7758-99-8',
		anhydrousId: 'copper-ii-sulfate',
		ions: [ion('Cu^2+'), ion('SO4^2-')],
		...phiLike('MgSO4'),
		ghsHazards: hazards('H302', 'H315', 'H319', 'H410')
	},
	{
		id: 'cobalt-ii-chloride-hexahydrate',
		name: 'Cobalt(II) chloride hexahydrate',
		category: 'trace-metal',
		formula: 'CoCl2·6H2O',
		casNumber: '7791-13-1',
		ions: [ion('Co^2+'), ion('Cl-', 2)],
		...phiLike('MgCl2'),
		solubilityGPerL25C: 562,
		solubilityBasisFormula: 'CoCl2',
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H302', 'H317', 'H334', 'H341', 'H350i', 'H360F', 'H410')
	},
	{
		id: 'nickel-ii-chloride-hexahydrate',
		name: 'Nickel(II) chloride hexahydrate',
		category: 'trace-metal',
		formula: 'NiCl2·6H2O',
		casNumber: '7791-20-0',
		ions: [ion('Ni^2+'), ion('Cl-', 2)],
		...phiLike('MgCl2'),
		solubilityGPerL25C: 675,
		solubilityBasisFormula: 'NiCl2',
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards(
			'H301',
			'H315',
			'H317',
			'H331',
			'H334',
			'H341',
			'H350i',
			'H360D',
			'H372',
			'H410'
		)
	},
	{
		id: 'sodium-molybdate-dihydrate',
		name: 'Sodium molybdate dihydrate',
		category: 'trace-metal',
		formula: 'Na2MoO4·2H2O',
		casNumber: '10102-40-6',
		ions: [ion('Na+', 2), ion('MoO4^2-')],
		...phiLike('Na2SO4'),
		solubilityGPerL25C: 650,
		solubilityBasisFormula: 'Na2MoO4',
		solubilitySource: CRC_INORGANIC
	},
	{
		id: 'ammonium-heptamolybdate-tetrahydrate',
		name: 'Ammonium heptamolybdate tetrahydrate',
		category: 'trace-metal',
		formula: '(NH4)6Mo7O24·4H2O',
		casNumber: '12054-85-2',
		ions: [ion('NH4+', 6), ion('Mo7O24^6-')],
		...idealElectrolyte
	},
	{
		id: 'sodium-selenite',
		name: 'Sodium selenite',
		category: 'trace-metal',
		formula: 'Na2SeO3',
		casNumber: '10102-18-8',
		ions: [ion('Na+', 2), ion('SeO3^2-')],
		...phiLike('Na2SO4'),
		ghsHazards: hazards('H300')
	},
	{
		id: 'boric-acid',
		name: 'Boric acid',
		category: 'trace-metal',
		formula: 'H3BO3',
		casNumber: '10043-35-3',
		...ideal,
		solubilityGPerL25C: 58,
		solubilitySource: CRC_INORGANIC,
		ghsHazards: hazards('H360FD')
	},
	{
		id: 'potassium-iodide',
		name: 'Potassium iodide',
		category: 'trace-metal',
		formula: 'KI',
		casNumber: '7681-11-0',
		ions: [ion('K+'), ion('I-')],
		...phiLike('KCl'),
		solubilityGPerL25C: 1480,
		solubilitySource: CRC_INORGANIC
	},

	// ---- sugars and polyols ----
	{
		id: 'd-glucose',
		name: 'D-Glucose, anhydrous',
		synonyms: ['glucose', 'dextrose'],
		category: 'sugar',
		formula: 'C6H12O6',
		casNumber: '50-99-7',
		...phi('glucose'),
		solubilityGPerL25C: 909,
		solubilitySource: SUGAR
	},
	{
		id: 'd-glucose-monohydrate',
		name: 'D-Glucose monohydrate',
		synonyms: ['dextrose monohydrate'],
		category: 'sugar',
		formula: 'C6H12O6·H2O',
		casNumber: '14431-43-7',
		anhydrousId: 'd-glucose',
		...phi('glucose'),
		solubilityGPerL25C: 909,
		solubilityBasisFormula: 'C6H12O6',
		solubilitySource: SUGAR
	},
	{
		id: 'sucrose',
		name: 'Sucrose',
		category: 'sugar',
		formula: 'C12H22O11',
		casNumber: '57-50-1',
		...phi('sucrose'),
		solubilityGPerL25C: 2110,
		solubilitySource: SUGAR
	},
	{
		id: 'lactose',
		name: 'Lactose, anhydrous',
		category: 'sugar',
		formula: 'C12H22O11',
		casNumber: '63-42-3',
		...ideal,
		solubilityGPerL25C: 195,
		solubilitySource: SUGAR
	},
	{
		id: 'lactose-monohydrate',
		name: 'Lactose monohydrate',
		category: 'sugar',
		formula: 'C12H22O11·H2O',
		casNumber: '64044-51-5',
		anhydrousId: 'lactose',
		...ideal,
		solubilityGPerL25C: 195,
		solubilityBasisFormula: 'C12H22O11',
		solubilitySource: SUGAR
	},
	{
		id: 'd-galactose',
		name: 'D-Galactose',
		synonyms: ['galactose'],
		category: 'sugar',
		formula: 'C6H12O6',
		casNumber: '59-23-4',
		...ideal,
		solubilityGPerL25C: 680,
		solubilitySource: SUGAR
	},
	{
		id: 'd-fructose',
		name: 'D-Fructose',
		synonyms: ['fructose'],
		category: 'sugar',
		formula: 'C6H12O6',
		casNumber: '57-48-7',
		...ideal,
		solubilityGPerL25C: 3750,
		solubilitySource: SUGAR
	},
	{
		id: 'maltose',
		name: 'Maltose, anhydrous',
		category: 'sugar',
		formula: 'C12H22O11',
		casNumber: '69-79-4',
		...ideal
	},
	{
		id: 'maltose-monohydrate',
		name: 'Maltose monohydrate',
		category: 'sugar',
		formula: 'C12H22O11·H2O',
		casNumber: '6363-53-7',
		anhydrousId: 'maltose',
		...ideal,
		solubilityGPerL25C: 1080,
		solubilityBasisFormula: 'C12H22O11',
		solubilitySource: SUGAR
	},
	{
		id: 'glycerol',
		name: 'Glycerol',
		synonyms: ['glycerin'],
		category: 'polyol',
		formula: 'C3H8O3',
		casNumber: '56-81-5',
		...ideal
	},
	{
		id: 'd-sorbitol',
		name: 'D-Sorbitol',
		synonyms: ['sorbitol'],
		category: 'polyol',
		formula: 'C6H14O6',
		casNumber: '50-70-4',
		...ideal,
		solubilityGPerL25C: 2350,
		solubilitySource: SUGAR
	},
	{
		id: 'd-mannitol',
		name: 'D-Mannitol',
		synonyms: ['mannitol'],
		category: 'polyol',
		formula: 'C6H14O6',
		casNumber: '69-65-8',
		...ideal,
		solubilityGPerL25C: 216,
		solubilitySource: SUGAR
	},

	// ---- amino acids (zwitterions: one uncharged particle each) ----
	{
		id: 'l-alanine',
		name: 'L-Alanine',
		category: 'amino-acid',
		formula: 'C3H7NO2',
		casNumber: '56-41-7',
		...ideal,
		solubilityGPerL25C: 166.9,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-arginine',
		name: 'L-Arginine',
		category: 'amino-acid',
		formula: 'C6H14N4O2',
		casNumber: '74-79-3',
		...ideal,
		solubilityGPerL25C: 182.6,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-arginine-hydrochloride',
		name: 'L-Arginine hydrochloride',
		category: 'amino-acid',
		formula: 'C6H14N4O2·HCl',
		casNumber: '1119-34-2',
		freeFormId: 'l-arginine',
		ions: [ion('argininium+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'l-asparagine',
		name: 'L-Asparagine, anhydrous',
		category: 'amino-acid',
		formula: 'C4H8N2O3',
		casNumber: '70-47-3',
		...ideal,
		solubilityGPerL25C: 25.1,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-asparagine-monohydrate',
		name: 'L-Asparagine monohydrate',
		category: 'amino-acid',
		formula: 'C4H8N2O3·H2O',
		casNumber: '5794-13-8',
		anhydrousId: 'l-asparagine',
		...ideal,
		solubilityGPerL25C: 25.1,
		solubilityBasisFormula: 'C4H8N2O3',
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-aspartic-acid',
		name: 'L-Aspartic acid',
		category: 'amino-acid',
		formula: 'C4H7NO4',
		casNumber: '56-84-8',
		...ideal,
		solubilityGPerL25C: 5.04,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-cysteine',
		name: 'L-Cysteine',
		category: 'amino-acid',
		formula: 'C3H7NO2S',
		casNumber: '52-90-4',
		...ideal
	},
	{
		id: 'l-cysteine-hydrochloride-monohydrate',
		name: 'L-Cysteine hydrochloride monohydrate',
		category: 'amino-acid',
		formula: 'C3H7NO2S·HCl·H2O',
		casNumber: '7048-04-6',
		freeFormId: 'l-cysteine',
		ions: [ion('cysteinium+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'l-cystine',
		name: 'L-Cystine',
		category: 'amino-acid',
		formula: 'C6H12N2O4S2',
		casNumber: '56-89-3',
		...ideal,
		solubilityGPerL25C: 0.112,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-cystine-dihydrochloride',
		name: 'L-Cystine dihydrochloride',
		category: 'amino-acid',
		formula: 'C6H12N2O4S2·2HCl',
		casNumber: '30925-07-6',
		freeFormId: 'l-cystine',
		ions: [ion('cystinium^2+'), ion('Cl-', 2)],
		...phiLike('CaCl2')
	},
	{
		id: 'l-glutamine',
		name: 'L-Glutamine',
		category: 'amino-acid',
		formula: 'C5H10N2O3',
		casNumber: '56-85-9',
		...ideal,
		solubilityGPerL25C: 42,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-alanyl-l-glutamine',
		name: 'L-Alanyl-L-glutamine',
		synonyms: ['alanyl-glutamine dipeptide'],
		category: 'amino-acid',
		formula: 'C8H15N3O4',
		casNumber: '39537-23-0',
		...ideal
	},
	{
		id: 'l-glutamic-acid',
		name: 'L-Glutamic acid',
		category: 'amino-acid',
		formula: 'C5H9NO4',
		casNumber: '56-86-0',
		...ideal,
		solubilityGPerL25C: 8.6,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-glutamic-acid-monosodium-salt-monohydrate',
		name: 'L-Glutamic acid monosodium salt monohydrate',
		synonyms: ['monosodium glutamate'],
		category: 'amino-acid',
		formula: 'C5H8NNaO4·H2O',
		casNumber: '6106-04-3',
		freeFormId: 'l-glutamic-acid',
		ions: [ion('Na+'), ion('glutamate-')],
		...phiLike('NaCl'),
		solubilityGPerL25C: 740,
		solubilitySource: MERCK
	},
	{
		id: 'glycine',
		name: 'Glycine',
		category: 'amino-acid',
		formula: 'C2H5NO2',
		casNumber: '56-40-6',
		...ideal,
		solubilityGPerL25C: 250.2,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-histidine',
		name: 'L-Histidine',
		category: 'amino-acid',
		formula: 'C6H9N3O2',
		casNumber: '71-00-1',
		...ideal,
		solubilityGPerL25C: 43.5,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-histidine-hydrochloride-monohydrate',
		name: 'L-Histidine hydrochloride monohydrate',
		category: 'amino-acid',
		formula: 'C6H9N3O2·HCl·H2O',
		casNumber: '5934-29-2',
		freeFormId: 'l-histidine',
		ions: [ion('histidinium+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'l-isoleucine',
		name: 'L-Isoleucine',
		category: 'amino-acid',
		formula: 'C6H13NO2',
		casNumber: '73-32-5',
		...ideal,
		solubilityGPerL25C: 34.2,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-leucine',
		name: 'L-Leucine',
		category: 'amino-acid',
		formula: 'C6H13NO2',
		casNumber: '61-90-5',
		...ideal,
		solubilityGPerL25C: 22,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-lysine',
		name: 'L-Lysine',
		category: 'amino-acid',
		formula: 'C6H14N2O2',
		casNumber: '56-87-1',
		...ideal
	},
	{
		id: 'l-lysine-hydrochloride',
		name: 'L-Lysine hydrochloride',
		synonyms: ['L-lysine monohydrochloride'],
		category: 'amino-acid',
		formula: 'C6H14N2O2·HCl',
		casNumber: '657-27-2',
		freeFormId: 'l-lysine',
		ions: [ion('lysinium+'), ion('Cl-')],
		...phiLike('NaCl'),
		solubilityGPerL25C: 650,
		solubilitySource: MERCK
	},
	{
		id: 'l-methionine',
		name: 'L-Methionine',
		category: 'amino-acid',
		formula: 'C5H11NO2S',
		casNumber: '63-68-3',
		...ideal,
		solubilityGPerL25C: 56,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-phenylalanine',
		name: 'L-Phenylalanine',
		category: 'amino-acid',
		formula: 'C9H11NO2',
		casNumber: '63-91-2',
		...ideal,
		solubilityGPerL25C: 27.9,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-proline',
		name: 'L-Proline',
		category: 'amino-acid',
		formula: 'C5H9NO2',
		casNumber: '147-85-3',
		...ideal,
		solubilityGPerL25C: 1625,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-serine',
		name: 'L-Serine',
		category: 'amino-acid',
		formula: 'C3H7NO3',
		casNumber: '56-45-1',
		...ideal,
		solubilityGPerL25C: 250,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-threonine',
		name: 'L-Threonine',
		category: 'amino-acid',
		formula: 'C4H9NO3',
		casNumber: '72-19-5',
		...ideal,
		solubilityGPerL25C: 98.1,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-tryptophan',
		name: 'L-Tryptophan',
		category: 'amino-acid',
		formula: 'C11H12N2O2',
		casNumber: '73-22-3',
		...ideal,
		solubilityGPerL25C: 13.2,
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-tyrosine',
		name: 'L-Tyrosine',
		category: 'amino-acid',
		formula: 'C9H11NO3',
		casNumber: '60-18-4',
		...ideal,
		solubilityGPerL25C: 0.453,
		solubilityPoints: [
			{ temperatureC: 0, gPerL: 0.196 },
			{ temperatureC: 50, gPerL: 1.05 }
		],
		solubilitySource: CRC_AMINO
	},
	{
		id: 'l-tyrosine-disodium-salt-dihydrate',
		name: 'L-Tyrosine disodium salt dihydrate',
		category: 'amino-acid',
		formula: 'C9H9NNa2O3·2H2O',
		casNumber: '122666-87-9',
		freeFormId: 'l-tyrosine',
		ions: [ion('Na+', 2), ion('tyrosinate^2-')],
		...phiLike('Na2SO4')
	},
	{
		id: 'l-valine',
		name: 'L-Valine',
		category: 'amino-acid',
		formula: 'C5H11NO2',
		casNumber: '72-18-4',
		...ideal,
		solubilityGPerL25C: 88.5,
		solubilitySource: CRC_AMINO
	},

	// ---- vitamins ----
	{
		id: 'thiamine-hydrochloride',
		name: 'Thiamine hydrochloride',
		synonyms: ['vitamin B1'],
		category: 'vitamin',
		formula: 'C12H17ClN4OS·HCl',
		casNumber: '67-03-8',
		ions: [ion('thiaminium^2+'), ion('Cl-', 2)],
		...phiLike('CaCl2'),
		solubilityGPerL25C: 1000,
		solubilitySource: MERCK
	},
	{
		id: 'riboflavin',
		name: 'Riboflavin',
		synonyms: ['vitamin B2'],
		category: 'vitamin',
		formula: 'C17H20N4O6',
		casNumber: '83-88-5',
		...ideal,
		solubilityGPerL25C: 0.07,
		solubilitySource: MERCK
	},
	{
		id: 'nicotinamide',
		name: 'Nicotinamide',
		synonyms: ['niacinamide'],
		category: 'vitamin',
		formula: 'C6H6N2O',
		casNumber: '98-92-0',
		...ideal,
		solubilityGPerL25C: 1000,
		solubilitySource: MERCK
	},
	{
		id: 'nicotinic-acid',
		name: 'Nicotinic acid',
		synonyms: ['niacin'],
		category: 'vitamin',
		formula: 'C6H5NO2',
		casNumber: '59-67-6',
		...ideal,
		solubilityGPerL25C: 16.7,
		solubilitySource: MERCK
	},
	{
		id: 'pyridoxine-hydrochloride',
		name: 'Pyridoxine hydrochloride',
		synonyms: ['vitamin B6'],
		category: 'vitamin',
		formula: 'C8H11NO3·HCl',
		casNumber: '58-56-0',
		ions: [ion('pyridoxinium+'), ion('Cl-')],
		...phiLike('NaCl'),
		solubilityGPerL25C: 220,
		solubilitySource: MERCK
	},
	{
		id: 'pyridoxal-hydrochloride',
		name: 'Pyridoxal hydrochloride',
		category: 'vitamin',
		formula: 'C8H9NO3·HCl',
		casNumber: '65-22-5',
		ions: [ion('pyridoxalium+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'd-calcium-pantothenate',
		name: 'D-Calcium pantothenate',
		synonyms: ['vitamin B5'],
		category: 'vitamin',
		formula: 'Ca(C9H16NO5)2',
		casNumber: '137-08-6',
		ions: [ion('Ca^2+'), ion('pantothenate-', 2)],
		...phiLike('CaCl2')
	},
	{
		id: 'd-biotin',
		name: 'D-Biotin',
		synonyms: ['biotin', 'vitamin B7'],
		category: 'vitamin',
		formula: 'C10H16N2O3S',
		casNumber: '58-85-5',
		...ideal,
		solubilityGPerL25C: 0.22,
		solubilitySource: MERCK
	},
	{
		id: 'folic-acid',
		name: 'Folic acid',
		synonyms: ['vitamin B9'],
		category: 'vitamin',
		formula: 'C19H19N7O6',
		casNumber: '59-30-3',
		...ideal,
		solubilityGPerL25C: 0.0016,
		solubilitySource: MERCK
	},
	{
		id: 'cyanocobalamin',
		name: 'Cyanocobalamin',
		synonyms: ['vitamin B12'],
		category: 'vitamin',
		formula: 'C63H88CoN14O14P',
		casNumber: '68-19-9',
		...ideal,
		solubilityGPerL25C: 12.5,
		solubilitySource: MERCK
	},
	{
		id: 'choline-chloride',
		name: 'Choline chloride',
		category: 'vitamin',
		formula: 'C5H14ClNO',
		casNumber: '67-48-1',
		ions: [ion('choline+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'myo-inositol',
		name: 'myo-Inositol',
		synonyms: ['inositol', 'i-inositol'],
		category: 'vitamin',
		formula: 'C6H12O6',
		casNumber: '87-89-8',
		...ideal,
		solubilityGPerL25C: 140,
		solubilitySource: MERCK
	},
	{
		id: 'l-ascorbic-acid',
		name: 'L-Ascorbic acid',
		synonyms: ['ascorbic acid', 'vitamin C'],
		category: 'vitamin',
		formula: 'C6H8O6',
		casNumber: '50-81-7',
		...ideal,
		solubilityGPerL25C: 330,
		solubilitySource: MERCK
	},

	// ---- buffers ----
	{
		id: 'hepes',
		name: 'HEPES',
		category: 'buffer',
		formula: 'C8H18N2O4S',
		casNumber: '7365-45-9',
		...ideal,
		solubilityGPerL25C: 400,
		solubilitySource: MERCK
	},
	{
		id: 'mops',
		name: 'MOPS',
		category: 'buffer',
		formula: 'C7H15NO4S',
		casNumber: '1132-61-2',
		...ideal
	},
	{
		id: 'mes',
		name: 'MES, anhydrous',
		category: 'buffer',
		formula: 'C6H13NO4S',
		casNumber: '4432-31-9',
		...ideal
	},
	{
		id: 'pipes',
		name: 'PIPES',
		category: 'buffer',
		formula: 'C8H18N2O6S2',
		casNumber: '5625-37-6',
		...ideal
	},
	{
		id: 'tris',
		name: 'Tris base',
		synonyms: ['tris(hydroxymethyl)aminomethane', 'trometamol'],
		category: 'buffer',
		formula: 'C4H11NO3',
		casNumber: '77-86-1',
		...ideal,
		solubilityGPerL25C: 550,
		solubilitySource: MERCK,
		ghsHazards: hazards('H315', 'H319', 'H335')
	},
	{
		id: 'tris-hydrochloride',
		name: 'Tris hydrochloride',
		category: 'buffer',
		formula: 'C4H11NO3·HCl',
		casNumber: '1185-53-1',
		freeFormId: 'tris',
		ions: [ion('TrisH+'), ion('Cl-')],
		...phiLike('NaCl')
	},
	{
		id: 'citric-acid-monohydrate',
		name: 'Citric acid monohydrate',
		category: 'buffer',
		formula: 'C6H8O7·H2O',
		casNumber: '5949-29-1',
		...ideal,
		ghsHazards: hazards('H319')
	},
	{
		id: 'sodium-pyruvate',
		name: 'Sodium pyruvate',
		category: 'other',
		formula: 'C3H3NaO3',
		casNumber: '113-24-6',
		ions: [ion('Na+'), ion('pyruvate-')],
		...phiLike('NaCl')
	},

	// ---- other defined supplements ----
	{
		id: 'edta-disodium-dihydrate',
		name: 'EDTA disodium salt dihydrate',
		category: 'other',
		formula: 'C10H14N2Na2O8·2H2O',
		casNumber: '6381-92-6',
		ions: [ion('Na+', 2), ion('H2EDTA^2-')],
		...phiLike('Na2SO4'),
		ghsHazards: hazards('H332', 'H373')
	},
	{
		id: 'glutathione-reduced',
		name: 'Glutathione, reduced',
		category: 'other',
		formula: 'C10H17N3O6S',
		casNumber: '70-18-8',
		...ideal
	},
	{
		id: 'putrescine-dihydrochloride',
		name: 'Putrescine dihydrochloride',
		category: 'other',
		formula: 'C4H12N2·2HCl',
		casNumber: '333-93-7',
		ions: [ion('putrescinium^2+'), ion('Cl-', 2)],
		...phiLike('CaCl2')
	},
	{
		id: 'ethanolamine',
		name: 'Ethanolamine',
		category: 'other',
		formula: 'C2H7NO',
		casNumber: '141-43-5',
		...ideal
	},
	{
		id: 'hypoxanthine',
		name: 'Hypoxanthine',
		category: 'other',
		formula: 'C5H4N4O',
		casNumber: '68-94-0',
		...ideal,
		solubilityGPerL25C: 0.7,
		solubilitySource: MERCK
	},
	{
		id: 'thymidine',
		name: 'Thymidine',
		category: 'other',
		formula: 'C10H14N2O5',
		casNumber: '50-89-5',
		...ideal
	},

	// ---- complex materials (no formula) ----
	{
		id: 'yeast-extract',
		name: 'Yeast extract',
		category: 'complex',
		casNumber: '8013-01-2',
		...ideal,
		elementalMassFractions: {
			C: 0.39,
			H: 0.06,
			O: 0.27,
			N: 0.105,
			P: 0.018,
			S: 0.006,
			K: 0.055,
			Na: 0.01,
			Mg: 0.0015,
			Ca: 0.0005,
			Cl: 0.005
		},
		fractionsNote: FRACTIONS_NOTE,
		fractionsSource: 'from memory'
	},
	{
		id: 'soy-peptone',
		name: 'Soy peptone (papaic digest of soybean meal)',
		category: 'complex',
		...ideal,
		elementalMassFractions: {
			C: 0.4,
			H: 0.06,
			O: 0.28,
			N: 0.09,
			P: 0.007,
			S: 0.005,
			K: 0.035,
			Na: 0.02,
			Mg: 0.003,
			Ca: 0.002,
			Cl: 0.006
		},
		fractionsNote: FRACTIONS_NOTE,
		fractionsSource: 'from memory'
	},
	{
		id: 'tryptone',
		name: 'Tryptone (pancreatic digest of casein)',
		synonyms: ['casein peptone'],
		category: 'complex',
		...ideal,
		elementalMassFractions: {
			C: 0.44,
			H: 0.065,
			O: 0.24,
			N: 0.13,
			P: 0.008,
			S: 0.007,
			K: 0.003,
			Na: 0.03,
			Mg: 0.0005,
			Ca: 0.001,
			Cl: 0.003
		},
		fractionsNote: FRACTIONS_NOTE,
		fractionsSource: 'from memory'
	},
	{
		id: 'casein-acid-hydrolysate',
		name: 'Casein acid hydrolysate',
		category: 'complex',
		...ideal,
		elementalMassFractions: {
			C: 0.3,
			H: 0.05,
			O: 0.17,
			N: 0.08,
			Na: 0.12,
			Cl: 0.19,
			P: 0.003,
			S: 0.005,
			K: 0.003
		},
		fractionsNote: FRACTIONS_NOTE,
		fractionsSource: 'from memory'
	},
	{
		id: 'ferric-ammonium-citrate',
		name: 'Ammonium iron(III) citrate (brown)',
		synonyms: ['ferric ammonium citrate'],
		category: 'complex',
		casNumber: '1185-57-5',
		...ideal,
		elementalMassFractions: { Fe: 0.175 },
		fractionsNote: `${FRACTIONS_NOTE}; only iron is given because C, H, N and O vary with the preparation`,
		fractionsSource:
			'iron 16.5–18.5 % for the brown form, pharmacopoeial specification; from memory'
	}
];
