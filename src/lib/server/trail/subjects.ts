import { eq, inArray } from 'drizzle-orm';
import { db } from '../db';
import { idSlices } from '../db/id-slices';
import {
	apiToken,
	batch,
	component,
	invitation,
	lot,
	organismProfile,
	recipe,
	recipeVersion,
	run,
	simulationScenario,
	study,
	user,
	vessel
} from '../db/schema';

/** What an audit entry was about, as a reader sees it: its number or name, and where it lives. */
export interface TrailSubject {
	type: string | null;
	typeLabel: string;
	label: string;
	href: string | null;
}

type Found = { id: string; label: string; href: string | null };

interface SubjectKind {
	typeLabel: string;
	/** One query for all of a page's ids of this kind. */
	find: (ids: string[]) => Found[];
}

const KINDS: Record<string, SubjectKind> = {
	batch: {
		typeLabel: 'Batch',
		find: (ids) =>
			db
				.select({ id: batch.id, label: batch.number })
				.from(batch)
				.where(inArray(batch.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/batches/${r.id}` }))
	},
	lot: {
		typeLabel: 'Lot',
		find: (ids) =>
			db
				.select({ id: lot.id, label: lot.code })
				.from(lot)
				.where(inArray(lot.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/lots/${r.id}` }))
	},
	recipe: {
		typeLabel: 'Recipe',
		find: (ids) =>
			db
				.select({ id: recipe.id, label: recipe.name })
				.from(recipe)
				.where(inArray(recipe.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/recipes/${r.id}` }))
	},
	recipe_version: {
		typeLabel: 'Recipe version',
		find: (ids) =>
			db
				.select({
					id: recipeVersion.id,
					n: recipeVersion.n,
					recipeId: recipe.id,
					name: recipe.name
				})
				.from(recipeVersion)
				.innerJoin(recipe, eq(recipe.id, recipeVersion.recipeId))
				.where(inArray(recipeVersion.id, ids))
				.all()
				.map((r) => ({
					id: r.id,
					label: `${r.name} version ${r.n}`,
					href: `/recipes/${r.recipeId}/versions/${r.n}`
				}))
	},
	component: {
		typeLabel: 'Component',
		find: (ids) =>
			db
				.select({ id: component.id, label: component.name })
				.from(component)
				.where(inArray(component.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/components/${r.id}` }))
	},
	user: {
		typeLabel: 'Person',
		find: (ids) =>
			db
				.select({ id: user.id, label: user.name })
				.from(user)
				.where(inArray(user.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/admin/people/${r.id}` }))
	},
	invitation: {
		typeLabel: 'Invitation',
		find: (ids) =>
			db
				.select({ id: invitation.id, email: invitation.email, name: invitation.name })
				.from(invitation)
				.where(inArray(invitation.id, ids))
				.all()
				.map((r) => ({ id: r.id, label: r.name || r.email, href: '/admin/people' }))
	},
	study: {
		typeLabel: 'Study',
		find: (ids) =>
			db
				.select({ id: study.id, label: study.name })
				.from(study)
				.where(inArray(study.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/studies/${r.id}` }))
	},
	api_token: {
		typeLabel: 'API token',
		find: (ids) =>
			db
				.select({ id: apiToken.id, label: apiToken.name, kind: apiToken.kind })
				.from(apiToken)
				.where(inArray(apiToken.id, ids))
				.all()
				.map((r) => ({
					id: r.id,
					label: r.label,
					href: r.kind === 'service' ? '/admin/tokens' : '/account/tokens'
				}))
	},
	run: {
		typeLabel: 'Run',
		find: (ids) =>
			db
				.select({ id: run.id, label: run.number })
				.from(run)
				.where(inArray(run.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/runs/${r.id}` }))
	},
	vessel: {
		typeLabel: 'Vessel',
		find: (ids) =>
			db
				.select({ id: vessel.id, label: vessel.name })
				.from(vessel)
				.where(inArray(vessel.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/vessels/${r.id}` }))
	},
	organism_profile: {
		typeLabel: 'Organism profile',
		find: (ids) =>
			db
				.select({ id: organismProfile.id, label: organismProfile.name })
				.from(organismProfile)
				.where(inArray(organismProfile.id, ids))
				.all()
				.map((r) => ({ ...r, href: `/organisms/${r.id}` }))
	},
	// Scenarios are private to their owner: named here, with no page to send an inspector to.
	simulation_scenario: {
		typeLabel: 'Simulation scenario',
		find: (ids) =>
			db
				.select({ id: simulationScenario.id, label: simulationScenario.name })
				.from(simulationScenario)
				.where(inArray(simulationScenario.id, ids))
				.all()
				.map((r) => ({ ...r, href: null }))
	}
};

const SITE: TrailSubject = {
	type: 'site',
	typeLabel: 'Site',
	label: 'Site settings',
	href: '/admin/settings'
};

/** Subject types the filter offers, with their labels. */
export const SUBJECT_TYPES: { value: string; label: string }[] = [
	...Object.entries(KINDS).map(([value, kind]) => ({ value, label: kind.typeLabel })),
	{ value: 'site', label: SITE.typeLabel }
];

export function subjectTypeLabel(type: string | null): string {
	if (!type) return '';
	if (type === 'site') return SITE.typeLabel;
	return KINDS[type]?.typeLabel ?? type.replace(/_/g, ' ');
}

export function subjectKey(type: string | null, id: string | null): string {
	return `${type ?? ''}:${id ?? ''}`;
}

/**
 * Each distinct subject of these entries, by `subjectKey`. One query per subject type (per 900
 * ids); a subject that no longer exists keeps its id as its label and has no link.
 */
export function resolveSubjects(
	entries: { subjectType: string | null; subjectId: string | null }[]
): Map<string, TrailSubject> {
	const idsByType = new Map<string, Set<string>>();
	for (const e of entries) {
		if (!e.subjectType || !e.subjectId) continue;
		if (!idsByType.has(e.subjectType)) idsByType.set(e.subjectType, new Set());
		idsByType.get(e.subjectType)!.add(e.subjectId);
	}
	const resolved = new Map<string, TrailSubject>();
	for (const [type, idSet] of idsByType) {
		const kind = KINDS[type];
		if (!kind) continue;
		for (const slice of idSlices(idSet)) {
			for (const found of kind.find(slice)) {
				resolved.set(subjectKey(type, found.id), {
					type,
					typeLabel: kind.typeLabel,
					label: found.label,
					href: found.href
				});
			}
		}
	}
	for (const e of entries) {
		const key = subjectKey(e.subjectType, e.subjectId);
		if (resolved.has(key)) continue;
		resolved.set(key, subjectOf(e.subjectType, e.subjectId));
	}
	return resolved;
}

/** A subject with nothing to look up: the site, a kind without an id, or one that is gone. */
function subjectOf(type: string | null, id: string | null): TrailSubject {
	if (type === 'site') return SITE;
	return { type, typeLabel: subjectTypeLabel(type), label: id ?? '', href: null };
}

/** The names of the people who acted, by id, in one query. */
export function peopleNamed(ids: (string | null)[]): Map<string, string> {
	const names = new Map<string, string>();
	for (const slice of idSlices(ids.filter((id): id is string => Boolean(id)))) {
		const rows = db
			.select({ id: user.id, name: user.name })
			.from(user)
			.where(inArray(user.id, slice))
			.all();
		for (const r of rows) names.set(r.id, r.name);
	}
	return names;
}
