import { asc, eq, inArray, sql } from 'drizzle-orm';
import { molarMassOf, parseFormula, type ComponentSpec } from '$chemistry';
import { changesBetween, recordAudit, type Actor } from '../audit';
import { db, type Db } from '../db';
import { component, type Component } from '../db/schema';
import { RuleError } from '../rule-error';

export type NewComponent = Omit<
	typeof component.$inferInsert,
	'id' | 'createdAt' | 'updatedAt' | 'revision'
>;

type Reader = Pick<Db, 'select'>;

export function listComponents(reader: Reader = db): Component[] {
	return reader.select().from(component).orderBy(asc(component.name)).all();
}

export function findComponent(id: string, reader: Reader = db): Component | undefined {
	return reader.select().from(component).where(eq(component.id, id)).get();
}

export function findComponentsByIds(ids: string[], reader: Reader = db): Map<string, Component> {
	const unique = [...new Set(ids.filter(Boolean))];
	if (unique.length === 0) return new Map();
	return new Map(
		reader
			.select()
			.from(component)
			.where(inArray(component.id, unique))
			.all()
			.map((c) => [c.id, c])
	);
}

function normaliseName(text: string): string {
	return text
		.toLowerCase()
		.replace(/[\s_·.,()-]+/g, ' ')
		.trim();
}

/**
 * By id, or by name or synonym with case and punctuation ignored ("D-glucose anhydrous" finds
 * "D-Glucose, anhydrous"): how CSV files and people name a component. A bare name that starts the
 * names of one basis form and its hydrates ("Magnesium sulfate") finds the basis form.
 */
export function findComponentByIdOrName(text: string, reader: Reader = db): Component | undefined {
	const trimmed = text.trim();
	if (!trimmed) return undefined;
	const exact =
		findComponent(trimmed, reader) ??
		reader
			.select()
			.from(component)
			.where(sql`lower(${component.name}) = lower(${trimmed})`)
			.get();
	if (exact) return exact;
	const wanted = normaliseName(trimmed);
	const all = listComponents(reader);
	const named = all.find((c) => [c.name, ...c.synonyms].some((n) => normaliseName(n) === wanted));
	if (named) return named;
	const starting = all.filter((c) => normaliseName(c.name).startsWith(`${wanted} `));
	const bases = starting.filter((c) => !c.basisComponentId);
	if (starting.length === 1) return starting[0];
	return bases.length === 1 &&
		starting.every((c) => c === bases[0] || c.basisComponentId === bases[0].id)
		? bases[0]
		: undefined;
}

/** What the composition engine needs from a stored component. */
export function componentSpecOf(row: Component): ComponentSpec {
	return {
		id: row.id,
		name: row.name,
		formula: row.formula,
		molarMassGPerMol: row.formula ? null : row.molarMassGPerMol,
		elementalMassFractions: row.elementalMassFractions,
		ions: row.ions,
		osmoticCoefficient: row.osmoticCoefficient,
		osmoticCoefficientSource: row.osmoticCoefficientSource,
		solubility: row.solubility
	};
}

/** Molar mass from the formula (IUPAC 2021 weights) or the stored average; null for complex materials. */
export function molarMassOfComponent(row: Component): number | null {
	if (row.formula) return molarMassOf(parseFormula(row.formula).elements);
	return row.molarMassGPerMol ?? null;
}

export function createComponent(
	actor: Actor,
	value: NewComponent,
	writer: Db | Parameters<Parameters<Db['transaction']>[0]>[0] = db
): string {
	const id = crypto.randomUUID();
	writer
		.insert(component)
		.values({ ...value, id })
		.run();
	recordAudit(
		actor,
		{
			action: 'component.created',
			subjectType: 'component',
			subjectId: id,
			detail: { name: value.name }
		},
		writer
	);
	return id;
}

/** Saves an edit made from `revision`; an edit made meanwhile by someone else is not overwritten. */
export function updateComponent(
	actor: Actor,
	id: string,
	revision: number,
	value: NewComponent
): void {
	db.transaction((tx) => {
		const current = findComponent(id, tx);
		if (!current) throw new RuleError('No component with this id.', { status: 404 });
		if (current.revision !== revision) {
			throw new RuleError(
				`Someone saved this component after you opened it (revision ${current.revision}, yours ${revision}). Reload to see their change, then make yours again.`,
				{ status: 409 }
			);
		}
		const changes = changesBetween(current, { ...value, synonyms: current.synonyms });
		tx.update(component)
			.set({ ...value, synonyms: current.synonyms, revision: revision + 1, updatedAt: new Date() })
			.where(eq(component.id, id))
			.run();
		recordAudit(
			actor,
			{
				action: 'component.updated',
				subjectType: 'component',
				subjectId: id,
				detail: { name: value.name, changes }
			},
			tx
		);
	});
}
