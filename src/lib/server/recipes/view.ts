import { RuleError } from '../rule-error';
import { analyseVersion, type RecipeAnalysis } from './analysis';
import {
	describedLinesOf,
	findRecipe,
	findVersion,
	personName,
	versionSignatures,
	versionsOf
} from './queries';

/** Everything a person (or script) reads about one version: lines, composition, signatures. */
export function versionView(recipeId: string, n: number) {
	const recipe = findRecipe(recipeId);
	if (!recipe) throw new RuleError('No recipe with this id.', { status: 404 });
	const version = findVersion(recipe.id, n);
	if (!version) throw new RuleError(`${recipe.name} has no version ${n}.`, { status: 404 });
	let analysis: RecipeAnalysis | null = null;
	let analysisError: string | null = null;
	try {
		analysis = analyseVersion(version);
	} catch (cause) {
		if (!(cause instanceof RuleError)) throw cause;
		analysisError = cause.message;
	}
	return {
		recipe,
		version: {
			...version,
			authorName: personName(version.authorId),
			approvedByName: personName(version.approvedById)
		},
		lines: describedLinesOf(version.id),
		analysis,
		analysisError,
		signatures: versionSignatures(version.id)
	};
}

export function recipeView(recipeId: string) {
	const recipe = findRecipe(recipeId);
	if (!recipe) throw new RuleError('No recipe with this id.', { status: 404 });
	return {
		recipe: { ...recipe, ownerName: personName(recipe.ownerId) },
		versions: versionsOf(recipe.id)
	};
}
