import { error } from '@sveltejs/kit';
import { requirePermission } from '$lib/server/guard';
import { analyseVersion } from '$lib/server/recipes/analysis';
import { compareCompositions, compareVersions } from '$lib/server/recipes/compare';
import { fieldsOf } from '$lib/server/recipes/drafts';
import { describedLinesOf, findRecipe, findVersion, versionsOf } from '$lib/server/recipes/queries';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	requirePermission('recipe.view');
	const recipe = findRecipe(params.id);
	if (!recipe) error(404, { message: 'No recipe with this id.' });
	const versions = versionsOf(recipe.id);
	const pick = (name: string, fallback: number | undefined) => {
		const raw = url.searchParams.get(name);
		const n = raw === null ? fallback : Number(raw);
		const version = Number.isSafeInteger(n) ? findVersion(recipe.id, n!) : undefined;
		if (!version)
			error(404, {
				message: `${recipe.name} has no version ${raw ?? ''}; choose two versions that exist.`
			});
		return version;
	};
	const b = pick('b', versions[0]?.n);
	const a = pick('a', versions[1]?.n ?? versions[0]?.n);
	const comparison = compareVersions(
		{ fields: fieldsOf(a), lines: describedLinesOf(a.id) },
		{ fields: fieldsOf(b), lines: describedLinesOf(b.id) }
	);
	const composition = compareCompositions(analyseVersion(a), analyseVersion(b));
	return {
		recipe,
		composition,
		a: { n: a.n, status: a.status },
		b: { n: b.n, status: b.status },
		numbers: versions.map((v) => v.n),
		comparison
	};
};
