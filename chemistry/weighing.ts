/**
 * Mass to weigh and stock volume to add.
 *
 * mass = target (g/L of the basis form) × volume × hydrate factor × assay factor × water factor, with
 *   hydrate factor = M(shelf form) / (n · M(basis form)), n basis units per shelf formula unit;
 *   assay factor   = 100 / assay %;
 *   water factor   = 100 / (100 − water %).
 * See WATER_CONVENTION for what the water and assay percentages mean, so nothing is corrected twice.
 */
import { ChemistryInputError } from './errors';
import { readMolarMass } from './input';
import { molarMassOf, parseFormula } from './formula';
import {
	checkAmount,
	convertConcentration,
	isMolarUnit,
	normalizeConcentrationUnit,
	toGramsPerLitre
} from './units';

export const WATER_CONVENTION =
	'Water content is the extra, non-stoichiometric water found on the certificate (loss on drying or Karl Fischer) beyond the water already in the shelf formula: for MgSO4·7H2O give only the water above the seven H2O, and for a salt listed as anhydrous give all of it. The assay is taken on the dried basis; if the certificate gives the assay "as is", already including the water, enter water as 0 so it is not corrected twice. Assays up to 102 % are accepted because pharmacopoeial assays may read slightly above 100 %; such a value lowers the mass.';

export const MAX_ASSAY_PERCENT = 102;

export interface FormSpec {
	formula?: string | null;
	molarMassGPerMol?: number | null;
}

export interface ShelfFormSpec extends FormSpec {
	assayPercent?: number | null;
	waterContentPercent?: number | null;
}

export interface MassToWeighInput {
	/** Target concentration of the basis form in g/L; or give `target` in any concentration unit. */
	targetGPerL?: number;
	target?: { amount: number; unit: string };
	volumeL: number;
	/** The form the target is expressed as (e.g. anhydrous MgSO4); omitted: the shelf form itself. */
	basis?: FormSpec | null;
	shelfForm: ShelfFormSpec;
	/** Basis units per shelf formula unit, e.g. 2 for pantothenate from calcium pantothenate. */
	basisUnitsPerShelfUnit?: number;
}

export interface MassToWeighResult {
	massG: number;
	/** Mass of the basis form the batch must contain. */
	basisMassG: number;
	targetGPerL: number;
	basisMolarMassGPerMol: number | null;
	shelfMolarMassGPerMol: number | null;
	factors: { hydrate: number; assay: number; water: number; total: number };
	steps: string[];
	convention: string;
}

function fieldPath(prefix: string, key: string): string {
	return prefix ? `${prefix}.${key}` : key;
}

function molarMassOfForm(form: FormSpec | null | undefined, field: string): number | null {
	if (!form) return null;
	if (form.formula != null && form.formula !== '') {
		try {
			return molarMassOf(parseFormula(form.formula).elements);
		} catch (e) {
			if (e instanceof ChemistryInputError) {
				throw new ChemistryInputError(e.message, {
					field: fieldPath(field, 'formula'),
					position: e.position
				});
			}
			throw e;
		}
	}
	if (form.molarMassGPerMol != null) {
		return readMolarMass(form.molarMassGPerMol, fieldPath(field, 'molarMassGPerMol'));
	}
	return null;
}

/**
 * Mass of the shelf form per mass of the basis form it carries: M(shelf) / (n · M(basis)), with n basis
 * units per shelf formula unit (MgSO4·7H2O for MgSO4: 246.466 / 120.361 = 2.0477).
 */
export function hydrateFactor(
	shelfMolarMassGPerMol: number,
	basisMolarMassGPerMol: number,
	basisUnitsPerShelfUnit = 1
): number {
	return shelfMolarMassGPerMol / (basisUnitsPerShelfUnit * basisMolarMassGPerMol);
}

function round(value: number, digits = 6): string {
	return Number(value.toPrecision(digits)).toString();
}

export function computeMassToWeigh(input: MassToWeighInput): MassToWeighResult {
	if (!input || typeof input !== 'object') throw new ChemistryInputError('Input is missing');
	checkAmount(input.volumeL, 'volumeL');
	if (!input.shelfForm || typeof input.shelfForm !== 'object') {
		throw new ChemistryInputError('The shelf form is required', { field: 'shelfForm' });
	}
	const shelfMolarMass = molarMassOfForm(input.shelfForm, 'shelfForm');
	const basisMolarMass = molarMassOfForm(input.basis, 'basis');
	const n = input.basisUnitsPerShelfUnit ?? 1;
	checkAmount(n, 'basisUnitsPerShelfUnit');
	const targetGPerL = readTargetGPerL(input, basisMolarMass ?? shelfMolarMass);
	const hydrate = readHydrateFactor(input, shelfMolarMass, basisMolarMass, n);
	const { assayPercent, waterPercent } = readPurity(input.shelfForm);

	const assay = 100 / assayPercent;
	const water = 100 / (100 - waterPercent);
	const total = hydrate * assay * water;
	const basisMassG = targetGPerL * input.volumeL;
	const massG = basisMassG * total;
	const steps = [
		`${round(targetGPerL)} g/L × ${round(input.volumeL)} L = ${round(basisMassG)} g of the basis form`
	];
	if (input.basis) {
		const basisText =
			n === 1 ? round(basisMolarMass as number) : `(${n} × ${round(basisMolarMass as number)})`;
		steps.push(
			`hydrate factor ${round(shelfMolarMass as number)} / ${basisText} = ${round(hydrate)}`
		);
	}
	if (assayPercent !== 100) steps.push(`assay factor 100 / ${assayPercent} = ${round(assay)}`);
	if (waterPercent !== 0)
		steps.push(`water factor 100 / (100 − ${waterPercent}) = ${round(water)}`);
	steps.push(`weigh ${round(massG)} g`);

	return {
		massG,
		basisMassG,
		targetGPerL,
		basisMolarMassGPerMol: basisMolarMass,
		shelfMolarMassGPerMol: shelfMolarMass,
		factors: { hydrate, assay, water, total },
		steps,
		convention: WATER_CONVENTION
	};
}

/** The target in g/L of the basis form, from `targetGPerL` or from `target` in any concentration unit. */
function readTargetGPerL(input: MassToWeighInput, molarMassGPerMol: number | null): number {
	if (input.targetGPerL !== undefined && input.target !== undefined) {
		throw new ChemistryInputError('Give targetGPerL or target, not both', { field: 'target' });
	}
	if (input.target !== undefined) {
		if (!input.target || typeof input.target !== 'object') {
			throw new ChemistryInputError('Target needs an amount and a unit', { field: 'target' });
		}
		return toGramsPerLitre(
			input.target.amount,
			input.target.unit,
			molarMassGPerMol,
			'target.amount',
			'target.unit'
		);
	}
	if (input.targetGPerL === undefined) {
		throw new ChemistryInputError('A target concentration is required', { field: 'targetGPerL' });
	}
	return checkAmount(input.targetGPerL, 'targetGPerL');
}

/** The hydrate factor when a basis form is given (both molar masses needed), else 1. */
function readHydrateFactor(
	input: MassToWeighInput,
	shelfMolarMass: number | null,
	basisMolarMass: number | null,
	basisUnitsPerShelfUnit: number
): number {
	if (!input.basis) {
		if (basisUnitsPerShelfUnit !== 1) {
			throw new ChemistryInputError('basisUnitsPerShelfUnit needs a basis form', {
				field: 'basisUnitsPerShelfUnit'
			});
		}
		return 1;
	}
	if (basisMolarMass === null) {
		throw new ChemistryInputError('The basis form needs a formula or molar mass', {
			field: 'basis.formula'
		});
	}
	if (shelfMolarMass === null) {
		throw new ChemistryInputError(
			'The shelf form needs a formula or molar mass to convert from the basis form',
			{
				field: 'shelfForm.formula'
			}
		);
	}
	return hydrateFactor(shelfMolarMass, basisMolarMass, basisUnitsPerShelfUnit);
}

/** The shelf form's assay (default 100 %) and water content (default 0 %). */
function readPurity(shelfForm: MassToWeighInput['shelfForm']): {
	assayPercent: number;
	waterPercent: number;
} {
	const assayPercent = shelfForm.assayPercent ?? 100;
	if (
		typeof assayPercent !== 'number' ||
		!Number.isFinite(assayPercent) ||
		assayPercent <= 0 ||
		assayPercent > MAX_ASSAY_PERCENT
	) {
		throw new ChemistryInputError(`Assay must be above 0 and at most ${MAX_ASSAY_PERCENT} %`, {
			field: 'shelfForm.assayPercent'
		});
	}
	const waterPercent = shelfForm.waterContentPercent ?? 0;
	if (
		typeof waterPercent !== 'number' ||
		!Number.isFinite(waterPercent) ||
		waterPercent < 0 ||
		waterPercent >= 100
	) {
		throw new ChemistryInputError('Water content must be at least 0 and below 100 %', {
			field: 'shelfForm.waterContentPercent'
		});
	}
	return { assayPercent, waterPercent };
}

export interface StockVolumeInput {
	target: { amount: number; unit: string };
	stock: { amount: number; unit: string };
	volumeL: number;
	/** Needed when one concentration is molar and the other a mass unit. */
	formula?: string | null;
	molarMassGPerMol?: number | null;
}

export interface StockVolumeResult {
	volumeML: number;
	dilutionFactor: number;
	steps: string[];
}

/** Volume of a stock solution that brings `volumeL` of medium to the target (C1·V1 = C2·V2). */
export function computeStockVolume(input: StockVolumeInput): StockVolumeResult {
	if (!input || typeof input !== 'object') throw new ChemistryInputError('Input is missing');
	checkAmount(input.volumeL, 'volumeL');
	const molarMass = molarMassOfForm(
		{ formula: input.formula, molarMassGPerMol: input.molarMassGPerMol },
		''
	);
	for (const key of ['target', 'stock'] as const) {
		if (!input[key] || typeof input[key] !== 'object') {
			throw new ChemistryInputError(`${key} needs an amount and a unit`, { field: key });
		}
	}
	const targetAmount = checkAmount(input.target.amount, 'target.amount');
	const stockAmount = checkAmount(input.stock.amount, 'stock.amount');
	const targetUnit = normalizeConcentrationUnit(input.target.unit, 'target.unit');
	const stockUnit = normalizeConcentrationUnit(input.stock.unit, 'stock.unit');
	if (isMolarUnit(targetUnit) !== isMolarUnit(stockUnit) && molarMass === null) {
		throw new ChemistryInputError(
			'Give the formula or molar mass to relate a molar and a mass concentration',
			{
				field: 'formula'
			}
		);
	}
	const stockInTargetUnit = convertConcentration(stockAmount, stockUnit, targetUnit, molarMass);
	if (stockInTargetUnit < targetAmount) {
		throw new ChemistryInputError(
			'The stock is weaker than the target; it cannot reach it by dilution',
			{
				field: 'stock.amount'
			}
		);
	}
	const dilutionFactor = stockInTargetUnit / targetAmount;
	const volumeML = (input.volumeL * 1000) / dilutionFactor;
	return {
		volumeML,
		dilutionFactor,
		steps: [
			`stock ${round(stockInTargetUnit)} ${targetUnit} ÷ target ${round(targetAmount)} ${targetUnit} = ${round(dilutionFactor)}× dilution`,
			`${round(input.volumeL * 1000)} mL ÷ ${round(dilutionFactor)} = ${round(volumeML)} mL of stock, made up to volume`
		]
	};
}
