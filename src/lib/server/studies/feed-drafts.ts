import { blankLine, type DraftFieldsInput } from '$lib/recipes';
import type { Actor } from '../audit';
import { listComponents } from '../components/library';
import { analyseLines } from '../recipes/analysis';
import { checkDraft } from '../recipes/draft';
import { createRecipesWithDrafts } from '../recipes/drafts';
import { RuleError } from '../rule-error';
import { designFeed, type FeedDesign, type FeedDesignRequest } from './feed-designer';
import { findStudy, loadStudyInputs } from './queries';

export interface SavedFeedDraft {
	recipeId: string;
	name: string;
	editUrl: string;
}

function formatL(volumeL: number): string {
	return `${Number(volumeL.toPrecision(3))} L`;
}

function instructionsFor(
	studyName: string,
	design: FeedDesign,
	index: number,
	names: string[]
): string {
	const feed = design.feeds[index];
	const others = design.feeds.map((f, i) => ({ f, name: names[i] })).filter((_, i) => i !== index);
	const volumes = design.feeds.map((f, i) => `${formatL(f.volumeL)} of ${names[i]}`).join(' and ');
	const lines = [
		`Proposed by the feed designer for the study “${studyName}”: ${volumes} over the run, prepared at ${design.temperatureC} °C, covers every nutrient at the target with the study's safety factor.`,
		feed.description
	];
	if (others.length) {
		lines.push(
			`Keep it apart from ${others.map((o) => o.name).join(', ')}: in one feed the recipe analysis flags ${design.split?.precipitates.join(', ') ?? 'a precipitation pair'}.`
		);
	}
	lines.push('Check the amounts, then write out how to prepare it.');
	return lines.join('\n\n');
}

/**
 * Designs the feed(s) again from the same request and saves each proposed feed as a new feed recipe
 * with a version 1 draft holding its lines, through the same checks as the recipe editor.
 */
export function saveFeedDesignDrafts(
	actor: Actor,
	studyId: string,
	request: FeedDesignRequest & { names: string[] }
): SavedFeedDraft[] {
	const study = findStudy(studyId);
	if (!study) throw new RuleError('No such study.', { status: 404 });
	const { inputs } = loadStudyInputs(studyId);
	const design = designFeed(inputs, new Map(listComponents().map((c) => [c.id, c])), request);
	if (!design.feasible)
		throw new RuleError(`This proposal cannot be saved: ${design.problems.join(' ')}`, {
			status: 422
		});
	if (design.feeds.length === 0)
		throw new RuleError('No feed is needed, so there is nothing to save.', { status: 422 });
	if (request.names.length !== design.feeds.length) {
		throw new RuleError(
			`The proposal has ${design.feeds.length === 1 ? 'one feed' : `${design.feeds.length} feeds`}: give ${design.feeds.length === 1 ? 'it a name' : 'each a name'}.`,
			{ field: 'names' }
		);
	}
	const names = request.names.map((n) => n.trim());
	const drafts = design.feeds.map((feed, i) => {
		const fields: DraftFieldsInput = {
			targetPh: '',
			osmolalityMinMOsmPerKg: '',
			osmolalityMaxMOsmPerKg: String(design.osmolalityMaxMOsmPerKg),
			preparationTemperatureC: String(design.temperatureC),
			shelfLifeDays: '',
			storage: '',
			instructions: instructionsFor(study.name, design, i, names),
			changeNote: 'First draft, from the feed designer.'
		};
		const lines = feed.lines.map((l) => ({
			...blankLine('component'),
			componentId: l.componentId,
			amount: String(l.gPerL),
			unit: 'g/L'
		}));
		const checked = checkDraft({ fields, lines }, null);
		if (!checked.ok) {
			const [path, messages] = Object.entries(checked.fieldErrors)[0];
			throw new RuleError(
				`${feed.label} cannot be saved as a draft: ${messages.join(' ')} (${path})`,
				{ status: 422 }
			);
		}
		// The same analysis the editor's save runs; a rule it breaks stops the save.
		analyseLines(checked.value.lines, {
			temperatureC: checked.value.fields.preparationTemperatureC,
			osmolalityMinMOsmPerKg: null,
			osmolalityMaxMOsmPerKg: null
		});
		return { name: names[i], kind: 'feed', nameField: `names.${i}`, ...checked.value };
	});
	const ids = createRecipesWithDrafts(actor, drafts, {
		from: 'feed designer',
		studyId,
		feeds: design.feeds.length
	});
	return ids.map((recipeId, i) => ({
		recipeId,
		name: names[i],
		editUrl: `/recipes/${recipeId}/versions/1/edit`
	}));
}
