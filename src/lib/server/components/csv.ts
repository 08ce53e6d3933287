import { formatDateTime } from '$lib/date-time';
import { siteTimeZone } from '../site-time-zone';
import { recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { component } from '../db/schema';
import { parseCsv, toCsv, type CsvRowResult } from '../csv';
import { RuleError } from '../rule-error';
import { checkComponentText, componentText, type ComponentText } from './component-form';
import { listComponents, type NewComponent } from './library';

/** CSV column → the component field it fills. */
const COLUMN_FIELDS: Record<string, keyof ComponentText> = {
	name: 'name',
	category: 'category',
	formula: 'formula',
	molar_mass_g_per_mol: 'molarMassGPerMol',
	cas_number: 'casNumber',
	elemental_mass_fractions: 'elementalMassFractions',
	ions: 'ions',
	osmotic_coefficient: 'osmoticCoefficient',
	solubility_g_per_l: 'solubility',
	solubility_basis_formula: 'solubilityBasisFormula',
	ghs_hazards: 'ghsHazards',
	storage: 'storage',
	basis_component: 'basisComponent'
};

export const COMPONENT_CSV_COLUMNS = {
	required: ['name', 'category'],
	allowed: ['id', ...Object.keys(COLUMN_FIELDS)]
} as const;

const FIELD_COLUMNS = Object.fromEntries(Object.entries(COLUMN_FIELDS).map(([c, f]) => [f, c]));

export interface ComponentImportPreview {
	rows: CsvRowResult<NewComponent>[];
	errorCount: number;
}

/** Checks every row against the library and against the rows above it; writes nothing. */
export function previewComponentCsv(text: string): ComponentImportPreview {
	const table = parseCsv(text, COMPONENT_CSV_COLUMNS);
	if (table.rows.length === 0)
		throw new RuleError('The CSV has a header but no rows.', { field: 'csv' });
	const seen = new Map<string, number>();
	const rows = table.rows.map(({ rowNumber, values }) => {
		const input = Object.fromEntries(
			Object.entries(COLUMN_FIELDS).map(([column, field]) => [field, values[column] ?? ''])
		);
		const checked = checkComponentText(input);
		const errors = checked.ok
			? []
			: Object.entries(checked.fieldErrors).flatMap(([field, messages]) =>
					messages.map((m) => `${FIELD_COLUMNS[field] ?? field}: ${m}`)
				);
		const key = values.name.toLowerCase();
		if (key && seen.has(key))
			errors.push(`name: “${values.name}” is also on row ${seen.get(key)}.`);
		else seen.set(key, rowNumber);
		return { rowNumber, values, errors, value: checked.ok ? checked.value : undefined };
	});
	return { rows, errorCount: rows.filter((r) => r.errors.length).length };
}

/** All rows or none: any row with a problem refuses the whole file. Returns how many were added. */
export function importComponentCsv(actor: Actor, text: string): number {
	const preview = previewComponentCsv(text);
	if (preview.errorCount) {
		throw new RuleError(
			`${preview.errorCount} row${preview.errorCount === 1 ? ' has' : 's have'} problems; nothing was imported. Fix them and preview again.`,
			{ field: 'csv' }
		);
	}
	return db.transaction((tx) => {
		for (const row of preview.rows)
			tx.insert(component)
				.values({ ...row.value!, id: crypto.randomUUID() })
				.run();
		recordAudit(
			actor,
			{
				action: 'component.imported',
				subjectType: 'component',
				detail: { count: preview.rows.length, names: preview.rows.map((r) => r.value!.name) }
			},
			tx
		);
		return preview.rows.length;
	});
}

export function exportComponentsCsv(): string {
	const rows = listComponents().map((c) => {
		const text = componentText(c);
		return {
			id: c.id,
			...Object.fromEntries(
				Object.entries(COLUMN_FIELDS).map(([column, field]) => [column, text[field]])
			)
		};
	});
	return toCsv(
		rows,
		[...COMPONENT_CSV_COLUMNS.allowed],
		[`Brothwright component library, exported ${formatDateTime(new Date(), siteTimeZone())}`]
	);
}
