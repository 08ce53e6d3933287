import { RECIPE_KINDS, VERSION_STATUSES, type RecipeKind, type VersionStatus } from '$lib/recipes';
import { listComponents } from '$lib/server/components/library';
import { requirePermission } from '$lib/server/guard';
import { pageFrom } from '$lib/server/paging';
import { listRecipes } from '$lib/server/recipes/queries';
import type { PageServerLoad } from './$types';
import { may } from '$lib/permissions';

const PAGE_SIZE = 25;

function oneOf<T extends string>(value: string | null, allowed: readonly T[]): T | undefined {
	return value && (allowed as readonly string[]).includes(value) ? (value as T) : undefined;
}

export const load: PageServerLoad = async ({ url }) => {
	const user = requirePermission('recipe.view');
	const page = pageFrom(url);
	const filter = {
		kind: oneOf<RecipeKind>(url.searchParams.get('kind'), RECIPE_KINDS),
		status: oneOf<VersionStatus>(url.searchParams.get('status'), VERSION_STATUSES),
		componentId: url.searchParams.get('component') || undefined,
		search: (url.searchParams.get('q') ?? '').trim().slice(0, 120) || undefined
	};
	const { rows, total } = listRecipes({ ...filter, page, pageSize: PAGE_SIZE });
	return {
		rows,
		total,
		page,
		pageSize: PAGE_SIZE,
		filter: {
			kind: filter.kind ?? '',
			status: filter.status ?? '',
			component: filter.componentId ?? '',
			q: filter.search ?? ''
		},
		components: listComponents().map((c) => ({ id: c.id, name: c.name })),
		canCreate: may(user, 'recipe.edit')
	};
};
