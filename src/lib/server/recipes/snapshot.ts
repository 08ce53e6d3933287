// The components a version in review or approved computes with: taken from the library when the
// version is submitted and kept from then on, so an approved version, the batches planned from it
// and their printed sheets mean the same thing whatever later happens to the library.
import { and, asc, eq, gt, inArray } from 'drizzle-orm';
import { changesBetween, type FieldChange } from '../audit';
import { db, type Db } from '../db';
import {
	auditEvent,
	recipeLine,
	recipeVersionComponent,
	type Component,
	type ComponentSnapshot
} from '../db/schema';
import { findComponentsByIds } from '../components/library';

type Reader = Pick<Db, 'select'>;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

function toSnapshot(row: Component): ComponentSnapshot {
	return { ...row, createdAt: row.createdAt.toISOString(), updatedAt: row.updatedAt.toISOString() };
}

function fromSnapshot(data: ComponentSnapshot): Component {
	return { ...data, createdAt: new Date(data.createdAt), updatedAt: new Date(data.updatedAt) };
}

/** Takes (or, for a draft submitted again, retakes) the snapshot of the version's own lines. */
export function takeComponentSnapshot(tx: Tx, versionId: string): void {
	tx.delete(recipeVersionComponent).where(eq(recipeVersionComponent.versionId, versionId)).run();
	const ids = tx
		.select({ componentId: recipeLine.componentId, shelfFormId: recipeLine.shelfFormId })
		.from(recipeLine)
		.where(eq(recipeLine.versionId, versionId))
		.all()
		.flatMap((l) => [l.componentId ?? '', l.shelfFormId ?? '']);
	for (const row of findComponentsByIds(ids, tx).values()) {
		tx.insert(recipeVersionComponent)
			.values({
				versionId,
				componentId: row.id,
				componentRevision: row.revision,
				data: toSnapshot(row)
			})
			.run();
	}
}

/** A version back in draft computes with the library again. */
export function dropComponentSnapshot(tx: Tx, versionId: string): void {
	tx.delete(recipeVersionComponent).where(eq(recipeVersionComponent.versionId, versionId)).run();
}

/** The version's snapshot by component id; empty for a draft. */
export function componentSnapshotOf(
	versionId: string,
	reader: Reader = db
): Map<string, Component> {
	return new Map(
		reader
			.select({ data: recipeVersionComponent.data })
			.from(recipeVersionComponent)
			.where(eq(recipeVersionComponent.versionId, versionId))
			.all()
			.map(({ data }) => [data.id, fromSnapshot(data)])
	);
}

/** Snapshots of several versions at once, by version id. */
export function componentSnapshotsOf(
	versionIds: string[],
	reader: Reader = db
): Map<string, Map<string, Component>> {
	const byVersion = new Map<string, Map<string, Component>>();
	if (versionIds.length === 0) return byVersion;
	for (const row of reader
		.select()
		.from(recipeVersionComponent)
		.where(inArray(recipeVersionComponent.versionId, [...new Set(versionIds)]))
		.all()) {
		const map = byVersion.get(row.versionId) ?? new Map<string, Component>();
		map.set(row.componentId, fromSnapshot(row.data));
		byVersion.set(row.versionId, map);
	}
	return byVersion;
}

/**
 * The components a version computes with: its snapshot once submitted, the library for a draft
 * (and for any id a snapshot lacks, which only a draft's lines can name).
 */
export function componentsOfVersion(
	versionId: string | null,
	ids: string[],
	reader: Reader = db
): Map<string, Component> {
	const snapshot = versionId ? componentSnapshotOf(versionId, reader) : new Map();
	const missing = ids.filter((id) => id && !snapshot.has(id));
	const live = findComponentsByIds(missing, reader);
	return new Map([...snapshot, ...live].filter(([id]) => ids.includes(id)));
}

/** What of a component a recipe computes or weighs with, and what a person should hear about. */
const WEIGHED_FIELDS = [
	'name',
	'formula',
	'molarMassGPerMol',
	'basisComponentId',
	'densityGPerMl',
	'elementalMassFractions',
	'ions',
	'osmoticCoefficient',
	'solubility',
	'ghsHazards'
] as const;

function weighedFieldsOf(row: Component) {
	return Object.fromEntries(WEIGHED_FIELDS.map((field) => [field, row[field]]));
}

export interface LibraryChange {
	componentId: string;
	name: string;
	changes: Record<string, FieldChange>;
}

/**
 * Components of the version that the library has changed since: against its snapshot once
 * submitted (the version keeps its values; a new draft takes the change), or since its last save
 * for a draft (which already computes with the new values).
 */
export function libraryChangesFor(
	version: { id: string; status: string; updatedAt: Date },
	reader: Reader = db
): LibraryChange[] {
	const snapshot = componentSnapshotOf(version.id, reader);
	if (snapshot.size > 0) {
		const live = findComponentsByIds([...snapshot.keys()], reader);
		return [...snapshot.values()].flatMap((kept) => {
			const now = live.get(kept.id);
			if (!now || now.revision === kept.revision) return [];
			const changes = changesBetween(weighedFieldsOf(kept), weighedFieldsOf(now));
			return Object.keys(changes).length ? [{ componentId: kept.id, name: now.name, changes }] : [];
		});
	}
	if (version.status !== 'draft') return [];
	const ids = reader
		.select({ componentId: recipeLine.componentId, shelfFormId: recipeLine.shelfFormId })
		.from(recipeLine)
		.where(eq(recipeLine.versionId, version.id))
		.all()
		.flatMap((l) => [l.componentId, l.shelfFormId])
		.filter((id): id is string => Boolean(id));
	if (ids.length === 0) return [];
	const updates = reader
		.select()
		.from(auditEvent)
		.where(
			and(
				eq(auditEvent.action, 'component.updated'),
				inArray(auditEvent.subjectId, [...new Set(ids)]),
				gt(auditEvent.at, version.updatedAt)
			)
		)
		.orderBy(asc(auditEvent.seq))
		.all();
	const merged = new Map<string, LibraryChange>();
	for (const entry of updates) {
		const detail = (entry.detail ?? {}) as { name?: string; changes?: Record<string, FieldChange> };
		const id = entry.subjectId!;
		const known = merged.get(id) ?? { componentId: id, name: detail.name ?? id, changes: {} };
		for (const [field, change] of Object.entries(detail.changes ?? {})) {
			if (!(WEIGHED_FIELDS as readonly string[]).includes(field)) continue;
			known.changes[field] = { from: known.changes[field]?.from ?? change.from, to: change.to };
		}
		known.name = detail.name ?? known.name;
		merged.set(id, known);
	}
	return [...merged.values()].filter((c) => Object.keys(c.changes).length > 0);
}
