import { asc, desc, eq, inArray } from 'drizzle-orm';
import type { VersionStatus } from '$lib/recipes';
import { db, type Db } from '../db';
import {
	organismProfile,
	recipe,
	recipeVersion,
	study,
	studyFeed,
	vessel,
	type Component
} from '../db/schema';
import { listComponents, molarMassOfComponent } from '../components/library';
import { analyseVersion } from '../recipes/analysis';
import { RuleError } from '../rule-error';
import { toStudyVessel } from '../vessels/kla-map';
import type { StudyInputs, SupplyComposition } from './types';

type Reader = Pick<Db, 'select'>;

export interface VersionRef {
	id: string;
	recipeId: string;
	recipeName: string;
	recipeKind: string;
	n: number;
	status: VersionStatus;
	/** A later version of the same recipe is approved, or this one is retired. */
	superseded: boolean;
	supersededBy: number | null;
}

export function describeVersions(ids: string[], reader: Reader = db): Map<string, VersionRef> {
	const unique = [...new Set(ids)];
	if (unique.length === 0) return new Map();
	const rows = reader
		.select({
			id: recipeVersion.id,
			recipeId: recipeVersion.recipeId,
			n: recipeVersion.n,
			status: recipeVersion.status,
			recipeName: recipe.name,
			recipeKind: recipe.kind
		})
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.where(inArray(recipeVersion.id, unique))
		.all();
	const siblings = rows.length
		? reader
				.select({
					recipeId: recipeVersion.recipeId,
					n: recipeVersion.n,
					status: recipeVersion.status
				})
				.from(recipeVersion)
				.where(inArray(recipeVersion.recipeId, [...new Set(rows.map((r) => r.recipeId))]))
				.all()
		: [];
	return new Map(
		rows.map((r) => {
			const newer = siblings
				.filter((s) => s.recipeId === r.recipeId && s.n > r.n && s.status === 'approved')
				.sort((a, b) => b.n - a.n)[0];
			return [
				r.id,
				{
					...r,
					superseded: r.status === 'retired' || Boolean(newer),
					supersededBy: newer?.n ?? null
				}
			];
		})
	);
}

/** Composition per litre of a version, with each salt or hydrate also counted as its basis form. */
export function composeVersion(
	versionId: string,
	components: Map<string, Component>,
	reader: Reader = db
): { composition: SupplyComposition; temperatureC: number } {
	const version = reader.select().from(recipeVersion).where(eq(recipeVersion.id, versionId)).get();
	if (!version)
		throw new RuleError('That recipe version no longer exists; choose another.', {
			field: 'basalVersionId',
			status: 404
		});
	const analysis = analyseVersion(version, reader);
	const componentsGPerL: Record<string, number> = {};
	const add = (id: string, g: number) => (componentsGPerL[id] = (componentsGPerL[id] ?? 0) + g);
	for (const c of analysis.components) {
		add(c.id, c.gPerL);
		const row = components.get(c.id);
		const basis = row?.basisComponentId ? components.get(row.basisComponentId) : undefined;
		const own = row ? molarMassOfComponent(row) : null;
		const basisMass = basis ? molarMassOfComponent(basis) : null;
		if (basis && own && basisMass) add(basis.id, (c.gPerL / own) * basisMass);
	}
	const elementsGPerL = Object.fromEntries(
		analysis.elements.filter((e) => e.gPerL > 0).map((e) => [e.symbol, e.gPerL])
	);
	return {
		composition: { elementsGPerL, componentsGPerL },
		temperatureC: version.preparationTemperatureC
	};
}

export function findStudy(id: string, reader: Reader = db) {
	return reader.select().from(study).where(eq(study.id, id)).get();
}

export function feedsOf(studyId: string, reader: Reader = db) {
	return reader
		.select()
		.from(studyFeed)
		.where(eq(studyFeed.studyId, studyId))
		.orderBy(asc(studyFeed.position))
		.all();
}

function label(ref: VersionRef | undefined): string {
	return ref ? `${ref.recipeName} v${ref.n}` : 'unknown version';
}

/** Everything `evaluateStudy` needs for a saved study. */
export function loadStudyInputs(
	studyId: string,
	reader: Reader = db
): { inputs: StudyInputs; versions: Map<string, VersionRef> } {
	const row = findStudy(studyId, reader);
	if (!row) throw new RuleError('No such study.', { status: 404 });
	const feeds = feedsOf(studyId, reader);
	const profile = reader
		.select()
		.from(organismProfile)
		.where(eq(organismProfile.id, row.profileId))
		.get()!;
	const vesselRow = toStudyVessel(
		reader.select().from(vessel).where(eq(vessel.id, row.vesselId)).get()!,
		reader
	);
	const versions = describeVersions([row.basalVersionId, ...feeds.map((f) => f.versionId)], reader);
	const components = new Map(listComponents(reader).map((c) => [c.id, c]));
	const basal = composeVersion(row.basalVersionId, components, reader);
	return {
		versions,
		inputs: {
			plan: row,
			basal: {
				versionId: row.basalVersionId,
				label: label(versions.get(row.basalVersionId)),
				...basal
			},
			feeds: feeds.map((f) => ({
				versionId: f.versionId,
				label: label(versions.get(f.versionId)),
				volumeL: f.volumeL,
				plan: {
					strategy: f.strategy,
					startH: f.startH,
					muSetPerH: f.muSetPerH,
					setpointGPerL: f.setpointGPerL,
					doSetpointPercent: f.doSetpointPercent,
					maxRateLPerH: f.maxRateLPerH
				},
				...composeVersion(f.versionId, components, reader)
			})),
			profile,
			vessel: vesselRow,
			componentNames: Object.fromEntries([...components.values()].map((c) => [c.id, c.name])),
			componentFormulas: Object.fromEntries([...components.values()].map((c) => [c.id, c.formula]))
		}
	};
}

export function listProfiles(reader: Reader = db) {
	return reader.select().from(organismProfile).orderBy(asc(organismProfile.name)).all();
}

export function listVessels(reader: Reader = db) {
	return reader.select().from(vessel).orderBy(asc(vessel.maxWorkingVolumeL)).all();
}

/** Versions a study may use: every version of basal and feed recipes, newest first per recipe. */
export function listStudyVersionChoices(kind: 'basal' | 'feed') {
	return db
		.select({
			id: recipeVersion.id,
			n: recipeVersion.n,
			status: recipeVersion.status,
			recipeName: recipe.name
		})
		.from(recipeVersion)
		.innerJoin(recipe, eq(recipeVersion.recipeId, recipe.id))
		.where(eq(recipe.kind, kind))
		.orderBy(asc(recipe.name), desc(recipeVersion.n))
		.all();
}
