import { readDecimalText, storedNumberText } from '$lib/number-reading';
import { sql } from 'drizzle-orm';
import { z } from 'zod';
import { ChemistryInputError, molarMassOf, parseFormula, resolveComponent } from '$chemistry';
import {
	checkCasNumber,
	formatFractions,
	formatHazards,
	formatIons,
	formatSolubility,
	parseFractions,
	parseHazards,
	parseIons,
	parseSolubility
} from '$lib/component-notation';
import { COMPONENT_CATEGORIES, type ComponentCategoryName } from '$lib/recipes';
import { db, type Db } from '../db';
import { component, type Component } from '../db/schema';
import { formText, type FieldErrors } from '../forms';
import { knownHazardTexts } from './hazards';
import { componentSpecOf, findComponentByIdOrName, type NewComponent } from './library';

/** The text fields a component is entered with, on the form and in a CSV row alike. */
export const COMPONENT_FIELDS = [
	'name',
	'category',
	'formula',
	'molarMassGPerMol',
	'casNumber',
	'elementalMassFractions',
	'ions',
	'osmoticCoefficient',
	'solubility',
	'solubilityBasisFormula',
	'ghsHazards',
	'storage',
	'basisComponent'
] as const;

/** The fields that hold a number: the form sends their text, the API a JSON number or the text. */
const NUMBER_FIELDS = ['molarMassGPerMol', 'osmoticCoefficient'] as const;
type NumberField = (typeof NUMBER_FIELDS)[number];

const notANumber = 'Give a number, or leave it empty.';
const formNumber = z
	.union([z.number({ error: notANumber }), z.string({ error: notANumber })])
	.default('');

/**
 * The component's shape, on the form and in the API alike: every field as text (a number field may
 * be a number); checkComponentText says what each must hold.
 */
export const componentForm = z.object({
	...(Object.fromEntries(COMPONENT_FIELDS.map((f) => [f, formText])) as Record<
		Exclude<ComponentField, NumberField>,
		typeof formText
	>),
	...(Object.fromEntries(NUMBER_FIELDS.map((f) => [f, formNumber])) as Record<
		NumberField,
		typeof formNumber
	>)
});
export type ComponentField = (typeof COMPONENT_FIELDS)[number];
export type ComponentText = Record<ComponentField, string>;
/** A component as entered: text, or a number where the field holds one. */
export type ComponentInput = z.infer<typeof componentForm>;

type Reader = Pick<Db, 'select'>;

export function componentText(row: Component | undefined): ComponentText {
	const text = {} as ComponentText;
	for (const f of COMPONENT_FIELDS) text[f] = '';
	if (!row) return { ...text, category: 'salt' };
	return {
		...text,
		name: row.name,
		category: row.category,
		formula: row.formula ?? '',
		molarMassGPerMol: row.molarMassGPerMol == null ? '' : storedNumberText(row.molarMassGPerMol),
		casNumber: row.casNumber ?? '',
		elementalMassFractions: formatFractions(row.elementalMassFractions),
		ions: formatIons(row.ions),
		osmoticCoefficient:
			row.osmoticCoefficient == null ? '' : storedNumberText(row.osmoticCoefficient),
		solubility: formatSolubility(row.solubility?.points),
		solubilityBasisFormula: row.solubility?.basisFormula ?? '',
		ghsHazards: formatHazards(row.ghsHazards),
		storage: row.storage,
		basisComponent: row.basisComponentId ?? ''
	};
}

function optionalNumber(
	entered: string | number,
	field: string,
	errors: FieldErrors,
	check: (n: number) => string | null
): number | null {
	if (typeof entered === 'string' && !entered.trim()) return null;
	const read =
		typeof entered === 'number'
			? { ok: true as const, value: entered }
			: readDecimalText(entered.trim(), 'Number');
	const value = read.ok ? read.value : NaN;
	const problem = read.ok ? check(value) : `“${String(entered).trim()}” is not a number.`;
	if (problem) {
		errors[field] = [problem];
		return null;
	}
	return value;
}

/**
 * Checks a component as typed and turns it into a row; every problem is reported against its field.
 * `selfId` is the component being edited (it may keep its own name, and cannot be its own basis).
 */
export function checkComponentText(
	input: Partial<ComponentInput>,
	options: { selfId?: string; reader?: Reader } = {}
): { ok: true; value: NewComponent } | { ok: false; fieldErrors: FieldErrors } {
	const reader = options.reader ?? db;
	const t = Object.fromEntries(
		COMPONENT_FIELDS.map((f) => {
			const entered = input[f] ?? '';
			return [f, typeof entered === 'number' ? entered : entered.trim()];
		})
	) as ComponentInput;
	const errors: FieldErrors = {};

	checkNameAndCategory(t, errors, reader, options.selfId);
	const { formulaMolarMass, molarMass } = checkFormulaAndMass(t, errors);
	const cas = t.casNumber ? checkCasNumber(t.casNumber) : null;
	if (cas) errors.casNumber = [cas];
	const { fractions, ions } = checkMakeUp(t, errors, molarMass);
	const phi = optionalNumber(t.osmoticCoefficient, 'osmoticCoefficient', errors, (n) =>
		n > 0 && n <= 2 ? null : 'An osmotic coefficient is between 0 and 2.'
	);
	const { solubility, hazards } = checkSolubilityAndHazards(t, errors);
	const basisComponentId = checkBasisComponent(t, errors, reader, options.selfId);

	if (Object.keys(errors).length) return { ok: false, fieldErrors: errors };
	const value: NewComponent = {
		name: t.name,
		category: t.category as ComponentCategoryName,
		formula: t.formula || null,
		molarMassGPerMol: t.formula ? formulaMolarMass : molarMass,
		casNumber: t.casNumber || null,
		elementalMassFractions: fractions,
		fractionsNote: fractions ? "typical: replace with the lot's certificate values" : null,
		ions,
		osmoticCoefficient: phi,
		osmoticCoefficientSource: phi === null ? null : 'entered with the component',
		solubility: solubility
			? {
					points: solubility,
					basisFormula: t.solubilityBasisFormula || null,
					source: 'entered with the component'
				}
			: null,
		ghsHazards: hazards,
		hazardSource: hazards.length ? 'entered with the component; check the supplier SDS' : null,
		storage: t.storage,
		basisComponentId,
		synonyms: []
	};
	// The composition engine has the last word on whether the numbers hang together.
	try {
		resolveComponent(componentSpecOf({ ...value, id: 'check' } as Component));
	} catch (cause) {
		if (!(cause instanceof ChemistryInputError)) throw cause;
		const field = (cause.field ?? '').split('.')[1] ?? 'formula';
		return { ok: false, fieldErrors: { [field]: [cause.message] } };
	}
	return { ok: true, value };
}

function checkNameAndCategory(
	t: ComponentInput,
	errors: FieldErrors,
	reader: Reader,
	selfId: string | undefined
): void {
	if (!t.name) errors.name = ['Give the component a name.'];
	else if (t.name.length > 120) errors.name = ['Keep the name to 120 characters.'];
	else {
		const clash = reader
			.select({ id: component.id })
			.from(component)
			.where(sql`lower(${component.name}) = lower(${t.name})`)
			.get();
		if (clash && clash.id !== selfId)
			errors.name = [`A component named “${t.name}” already exists.`];
	}
	if (!(COMPONENT_CATEGORIES as readonly string[]).includes(t.category)) {
		errors.category = [`Choose a category: ${COMPONENT_CATEGORIES.join(', ')}.`];
	}
}

function checkFormulaAndMass(
	t: ComponentInput,
	errors: FieldErrors
): { formulaMolarMass: number | null; molarMass: number | null } {
	let formulaMolarMass: number | null = null;
	if (t.formula) {
		try {
			formulaMolarMass = molarMassOf(parseFormula(t.formula).elements);
		} catch (cause) {
			if (!(cause instanceof ChemistryInputError)) throw cause;
			errors.formula = [cause.message];
		}
	}
	const molarMass = optionalNumber(t.molarMassGPerMol, 'molarMassGPerMol', errors, (n) =>
		n > 0 ? null : 'A molar mass is more than 0 g/mol.'
	);
	if (molarMass !== null && t.formula) {
		errors.molarMassGPerMol = [
			'Leave the molar mass empty when there is a formula: it is computed from the formula.'
		];
	}
	return { formulaMolarMass, molarMass };
}

/** Elemental fractions (complex materials) and ions; a component needs a formula or fractions. */
function checkMakeUp(t: ComponentInput, errors: FieldErrors, molarMass: number | null) {
	const fractions = parseFractions(t.elementalMassFractions);
	if (!fractions.ok) errors.elementalMassFractions = [fractions.error];
	else if (fractions.value && t.formula) {
		errors.elementalMassFractions = [
			'Give either a formula or elemental fractions, not both: fractions are for complex materials.'
		];
	}
	if (
		!t.formula &&
		!(fractions.ok && fractions.value) &&
		t.category !== 'complex' &&
		!errors.formula
	) {
		errors.formula = [
			'Give a formula, or mark it a complex material and give its elemental fractions.'
		];
	}
	const ions = parseIons(t.ions);
	if (!ions.ok) errors.ions = [ions.error];
	else if (ions.value && !t.formula && molarMass === null)
		errors.ions = ['Ions need a formula or molar mass.'];
	return { fractions: fractions.ok ? fractions.value : null, ions: ions.ok ? ions.value : null };
}

function checkSolubilityAndHazards(t: ComponentInput, errors: FieldErrors) {
	const solubility = parseSolubility(t.solubility);
	if (!solubility.ok) errors.solubility = [solubility.error];
	if (t.solubilityBasisFormula) {
		try {
			parseFormula(t.solubilityBasisFormula);
		} catch (cause) {
			if (!(cause instanceof ChemistryInputError)) throw cause;
			errors.solubilityBasisFormula = [cause.message];
		}
		if (!t.solubility)
			errors.solubilityBasisFormula = [
				'A basis formula goes with solubility values; give them too.'
			];
	}
	const hazards = parseHazards(t.ghsHazards, knownHazardTexts());
	if (!hazards.ok) errors.ghsHazards = [hazards.error];
	if (t.storage.length > 300) errors.storage = ['Keep storage to 300 characters.'];
	return {
		solubility: solubility.ok ? solubility.value : null,
		hazards: hazards.ok ? hazards.value : []
	};
}

/** The component this one is a form of (a hydrate of an anhydrous salt, say), by id or name. */
function checkBasisComponent(
	t: ComponentInput,
	errors: FieldErrors,
	reader: Reader,
	selfId: string | undefined
): string | null {
	if (!t.basisComponent) return null;
	const basis = findComponentByIdOrName(t.basisComponent, reader);
	if (!basis) errors.basisComponent = [`No component “${t.basisComponent}” in the library.`];
	else if (basis.id === selfId)
		errors.basisComponent = ['A component cannot be its own basis form.'];
	else if (basis.basisComponentId)
		errors.basisComponent = [`${basis.name} is itself a form of another component; name that one.`];
	else if (!t.formula || !basis.formula)
		errors.basisComponent = ['Both this component and its basis need a formula.'];
	else return basis.id;
	return null;
}
