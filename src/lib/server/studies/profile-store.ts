import { readDecimalText } from '$lib/number-reading';
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import {
	ATOMIC_WEIGHTS,
	findBiomassComposition,
	listProfileElements,
	statementsOfComposition,
	type ElementStatements,
	type PerCellConsumption
} from '$chemistry';
import {
	CONSUMPTION_PATTERN,
	ORGANISM_GROUPS,
	PROFILE_KINDS,
	YIELD_METHODS,
	splitPairEntries
} from '$lib/studies';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db } from '../db';
import { organismProfile, type OrganismProfileRow } from '../db/schema';
import { findComponent, molarMassOfComponent } from '../components/library';
import { RuleError } from '../rule-error';
import { optionalNumber, optionalText, requiredText } from './fields';
import {
	elementStatementFormValues,
	readElementStatements,
	type ElementStatementTexts
} from './profile-elements';
import { formatSubstrateYields, parseSubstrateYields, resolveCarbonYield } from './profile-yields';

export const profileSchema = z.object({
	name: requiredText('Name'),
	group: z.enum(ORGANISM_GROUPS, { error: 'Choose bacterium, yeast or mammalian' }),
	kind: z.enum(PROFILE_KINDS, { error: 'Choose how the demand is described' }),
	presetId: z
		.string()
		.optional()
		.transform((v) => v || null),
	biomassFormula: z
		.string()
		.trim()
		.max(60)
		.optional()
		.transform((v) => v || null),
	ashFraction: optionalNumber('Ash fraction', { min: 0, max: 0.5 }),
	elementalFractions: optionalText(),
	fractionsSource: optionalText(400),
	componentRequirements: optionalText(),
	perCellConsumption: optionalText(),
	cellDryMassPg: optionalNumber('Cell dry mass', { gt: 0, max: 10000, unit: 'pg' }),
	carbonSourceId: z
		.string()
		.trim()
		.optional()
		.transform((v) => v || null),
	yieldXSMethod: z.enum(YIELD_METHODS, { error: 'Choose how Yx/s is obtained' }).default('entered'),
	yieldXSGPerG: optionalNumber('Yx/s', { gt: 0, max: 1.5, unit: 'g/g' }),
	respiratoryQuotient: optionalNumber('RQ', { min: 0.1, max: 10, unit: 'mol/mol' }),
	substrateYields: optionalText(),
	muMaxPerH: optionalNumber('μmax', { gt: 0, max: 3, unit: '1/h' }),
	ksGPerL: optionalNumber('Ks', { gt: 0, max: 100, unit: 'g/L' }),
	maintenanceGPerGH: optionalNumber('Maintenance', { min: 0, max: 1, unit: 'g/(g·h)' }),
	yieldXO2GPerG: optionalNumber('Yx/O2', { gt: 0, max: 5, unit: 'g/g' }),
	qO2MmolPerGH: optionalNumber('qO2', { gt: 0, max: 100, unit: 'mmol/(g·h)' }),
	notes: optionalText()
});

export type ProfileForm = z.infer<typeof profileSchema>;
type ProfileValues = Omit<
	typeof organismProfile.$inferInsert,
	'id' | 'createdAt' | 'updatedAt' | 'revision' | 'isDemo'
>;

/** "C 0.50" per line (or "C=0.50, N=0.14"). */
function parsePairs(text: string, field: string): [string, string][] {
	return splitPairEntries(text).map(({ entry, pair }, i) => {
		if (!pair)
			throw new RuleError(
				`Line ${i + 1} (“${entry}”) should be a name and a number, like “N 0.14”.`,
				{ field }
			);
		return pair;
	});
}

function readNumber(text: string, field: string, what: string): number {
	const read = readDecimalText(text, what);
	const v = read.ok ? read.value : NaN;
	if (!Number.isFinite(v) || v < 0)
		throw new RuleError(`${what}: “${text}” is not a number of 0 or more.`, { field });
	return v;
}

export function parseFractions(text: string): Record<string, number> | null {
	if (!text) return null;
	const out: Record<string, number> = {};
	for (const [symbol, value] of parsePairs(text, 'elementalFractions')) {
		if (!(symbol in ATOMIC_WEIGHTS))
			throw new RuleError(`“${symbol}” is not an element symbol.`, { field: 'elementalFractions' });
		out[symbol] = readNumber(value, 'elementalFractions', `Fraction of ${symbol}`);
	}
	const sum = Object.values(out).reduce((a, b) => a + b, 0);
	if (sum > 1 + 1e-9)
		throw new RuleError(
			`The fractions add up to ${sum.toFixed(3)}, more than 1 g per g dry biomass.`,
			{ field: 'elementalFractions' }
		);
	return out;
}

function parseRequirements(text: string): Record<string, number> | null {
	if (!text) return null;
	const out: Record<string, number> = {};
	for (const [id, value] of parsePairs(text, 'componentRequirements')) {
		if (!findComponent(id))
			throw new RuleError(`No component “${id}” in the library (use its id, e.g. l-glutamine).`, {
				field: 'componentRequirements'
			});
		out[id] = readNumber(value, 'componentRequirements', `Requirement of ${id}`);
	}
	return out;
}

/** "l-glutamine 1.2 mmol" (per 10^9 cells) or "d-glucose 350 pg" (per cell), one per line. */
export function parseConsumption(text: string): PerCellConsumption[] | null {
	if (!text) return null;
	const field = 'perCellConsumption';
	return text
		.split('\n')
		.map((l) => l.trim())
		.filter(Boolean)
		.map((entry, i) => {
			const m = CONSUMPTION_PATTERN.exec(entry);
			if (!m)
				throw new RuleError(
					`Line ${i + 1} (“${entry}”) should be a component id, a number and mmol (per 10⁹ cells) or pg (per cell).`,
					{ field }
				);
			const [, key, amount, unit] = m;
			const value = readNumber(amount, field, key);
			if (key in ATOMIC_WEIGHTS && !findComponent(key)) {
				return unit === 'pg'
					? { key, basis: 'element' as const, pgPerCell: value }
					: { key, basis: 'element' as const, mmolPer1e9Cells: value };
			}
			const component = findComponent(key);
			if (!component)
				throw new RuleError(
					`No component “${key}” in the library (use its id, e.g. l-glutamine).`,
					{ field }
				);
			if (unit === 'pg') return { key, basis: 'component' as const, pgPerCell: value };
			const molarMassGPerMol = molarMassOfComponent(component);
			if (molarMassGPerMol === null)
				throw new RuleError(`${component.name} has no molar mass, so give it in pg per cell.`, {
					field
				});
			return { key, basis: 'component' as const, mmolPer1e9Cells: value, molarMassGPerMol };
		});
}

export function formatPairs(map: Record<string, number> | null): string {
	return map
		? Object.entries(map)
				.map(([k, v]) => `${k} ${v}`)
				.join('\n')
		: '';
}

export function formatConsumption(list: PerCellConsumption[] | null): string {
	return list
		? list
				.map((c) =>
					c.pgPerCell !== undefined
						? `${c.key} ${c.pgPerCell} pg`
						: `${c.key} ${c.mmolPer1e9Cells} mmol`
				)
				.join('\n')
		: '';
}

/**
 * Turns the checked form into stored values; a published preset fills blank fractions, names its
 * source and gives each element the table's grade. `statements` holds each element's role,
 * confidence and source as typed (the form's fields `element.<symbol>.<part>`, the API's `element`);
 * without it, none is stated.
 */
export function profileValues(
	form: ProfileForm,
	statements?: ElementStatementTexts
): ProfileValues {
	let elementalFractions = parseFractions(form.elementalFractions);
	let fractionsSource = form.fractionsSource || null;
	let elementStatements: ElementStatements | null = null;
	let { ashFraction, cellDryMassPg, biomassFormula } = form;
	if (form.presetId) {
		const preset = findBiomassComposition(form.presetId);
		if (!preset) throw new RuleError('Unknown published table.', { field: 'presetId' });
		if (!elementalFractions) {
			elementalFractions = Object.fromEntries(
				Object.entries(preset.massFractions).map(([k, v]) => [k, Number(v.value.toPrecision(4))])
			);
			fractionsSource = preset.source;
			elementStatements = statementsOfComposition(preset);
		}
		ashFraction ??= preset.ashFraction?.value ?? null;
		cellDryMassPg ??= preset.cellDryMassPg?.value ?? null;
		biomassFormula ??= preset.formula;
	}
	const componentRequirements = parseRequirements(form.componentRequirements);
	const perCellConsumption = parseConsumption(form.perCellConsumption);
	if (!elementStatements && statements)
		elementStatements = readElementStatements(
			statements,
			listProfileElements({ elementalFractions, perCellConsumption })
		);
	if (form.kind === 'elementalFractions' && !elementalFractions) {
		throw new RuleError(
			'This kind needs elemental fractions: type them, or fill them from a published table.',
			{ field: 'elementalFractions' }
		);
	}
	if (form.kind === 'componentRequirements' && !componentRequirements)
		throw new RuleError('This kind needs at least one component requirement.', {
			field: 'componentRequirements'
		});
	if (form.kind === 'perCell' && !perCellConsumption)
		throw new RuleError('This kind needs per-cell consumption rates.', {
			field: 'perCellConsumption'
		});
	if (form.kind === 'perCell' && cellDryMassPg === null)
		throw new RuleError('Cell culture profiles need the cell dry mass (pg/cell).', {
			field: 'cellDryMassPg'
		});
	if (form.carbonSourceId && !findComponent(form.carbonSourceId))
		throw new RuleError('Choose the carbon source from the library.', { field: 'carbonSourceId' });
	const yieldFields = {
		...form,
		biomassFormula,
		ashFraction,
		elementalFractions,
		perCellConsumption
	};
	const yieldXSGPerG = resolveCarbonYield(yieldFields);
	const substrateYields = parseSubstrateYields(form.substrateYields, yieldFields);
	return {
		name: form.name,
		group: form.group,
		kind: form.kind,
		biomassFormula,
		ashFraction,
		elementalFractions,
		fractionsSource,
		elementStatements,
		componentRequirements,
		perCellConsumption,
		cellDryMassPg,
		carbonSourceId: form.carbonSourceId,
		yieldXSGPerG,
		yieldXSMethod: form.yieldXSMethod,
		respiratoryQuotient: form.respiratoryQuotient,
		substrateYields,
		muMaxPerH: form.muMaxPerH,
		ksGPerL: form.ksGPerL,
		maintenanceGPerGH: form.maintenanceGPerGH,
		yieldXO2GPerG: form.yieldXO2GPerG,
		qO2MmolPerGH: form.qO2MmolPerGH,
		notes: form.notes
	};
}

export function profileFormValues(row: OrganismProfileRow): Record<string, string> {
	const text = (v: number | string | null) => (v === null ? '' : String(v));
	return {
		name: row.name,
		group: row.group,
		kind: row.kind,
		presetId: '',
		biomassFormula: text(row.biomassFormula),
		ashFraction: text(row.ashFraction),
		elementalFractions: formatPairs(row.elementalFractions),
		fractionsSource: text(row.fractionsSource),
		componentRequirements: formatPairs(row.componentRequirements),
		perCellConsumption: formatConsumption(row.perCellConsumption),
		cellDryMassPg: text(row.cellDryMassPg),
		carbonSourceId: text(row.carbonSourceId),
		yieldXSGPerG: text(row.yieldXSGPerG),
		yieldXSMethod: row.yieldXSMethod,
		respiratoryQuotient: text(row.respiratoryQuotient),
		substrateYields: formatSubstrateYields(row.substrateYields),
		muMaxPerH: text(row.muMaxPerH),
		ksGPerL: text(row.ksGPerL),
		maintenanceGPerGH: text(row.maintenanceGPerGH),
		yieldXO2GPerG: text(row.yieldXO2GPerG),
		qO2MmolPerGH: text(row.qO2MmolPerGH),
		notes: row.notes,
		revision: String(row.revision),
		...elementStatementFormValues(row)
	};
}

function nameTaken(name: string, exceptId: string | null) {
	const other = db
		.select({ id: organismProfile.id })
		.from(organismProfile)
		.where(eq(organismProfile.name, name))
		.get();
	return other && other.id !== exceptId;
}

export function saveProfile(
	actor: Actor,
	id: string | null,
	revision: number | null,
	values: ProfileValues,
	isDemo = false
): string {
	return db.transaction((tx) => {
		if (nameTaken(values.name, id))
			throw new RuleError('A profile with this name exists; choose another name.', {
				field: 'name',
				status: 409
			});
		if (id === null) {
			const newId = crypto.randomUUID();
			tx.insert(organismProfile)
				.values({ id: newId, ...values, isDemo })
				.run();
			recordAudit(
				actor,
				{
					action: 'organism_profile.created',
					subjectType: 'organism_profile',
					subjectId: newId,
					detail: { name: values.name }
				},
				tx
			);
			return newId;
		}
		const current = tx.select().from(organismProfile).where(eq(organismProfile.id, id)).get();
		if (!current) throw new RuleError('No such profile.', { status: 404 });
		if (current.revision !== revision)
			throw new RuleError(
				'Someone else saved this profile meanwhile. Reload to see their changes.',
				{ status: 409 }
			);
		tx.update(organismProfile)
			.set({ ...values, revision: current.revision + 1, updatedAt: new Date() })
			.where(eq(organismProfile.id, id))
			.run();
		recordAudit(
			actor,
			{
				action: 'organism_profile.updated',
				subjectType: 'organism_profile',
				subjectId: id,
				detail: { name: values.name, changes: changesBetween(current, values) }
			},
			tx
		);
		return id;
	});
}
