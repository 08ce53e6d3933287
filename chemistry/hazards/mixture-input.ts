/** The checks on what classifySolution is given: each refusal names its field. */
import { ChemistryInputError } from '../errors';
import type { ClassifySolutionOptions, SolutionIngredient } from './mixture';

const INHALATION_FORMS = ['gas', 'vapour', 'dust-mist'];

export function checkIngredients(
	ingredients: readonly SolutionIngredient[],
	options: ClassifySolutionOptions
): void {
	if (!Array.isArray(ingredients)) {
		throw new ChemistryInputError('The ingredients must be a list.', { field: 'ingredients' });
	}
	let totalMassFraction = 0;
	ingredients.forEach((ingredient, i) => {
		checkIngredient(ingredient, i);
		totalMassFraction += ingredient.massFraction;
	});
	if (totalMassFraction > 1 + 1e-6) {
		throw new ChemistryInputError(
			`The mass fractions add up to ${round(totalMassFraction)} g/g, more than the whole solution (1 g/g).`,
			{ field: 'ingredients' }
		);
	}
	if (
		options.pH !== undefined &&
		!(Number.isFinite(options.pH) && options.pH >= -2 && options.pH <= 16)
	) {
		throw new ChemistryInputError(`pH must be a number from -2 to 16 (it is ${options.pH}).`, {
			field: 'pH'
		});
	}
	if (options.inhalationForm !== undefined && !INHALATION_FORMS.includes(options.inhalationForm)) {
		throw new ChemistryInputError(
			`Inhalation form must be one of ${INHALATION_FORMS.join(', ')} (it is ${options.inhalationForm}).`,
			{ field: 'inhalationForm' }
		);
	}
}

function checkIngredient(ingredient: SolutionIngredient, i: number): void {
	const field = `ingredients.${i}`;
	if (typeof ingredient.name !== 'string' || ingredient.name.trim() === '') {
		throw new ChemistryInputError(`Ingredient ${i + 1} needs a name.`, { field: `${field}.name` });
	}
	const label = ingredient.name.trim();
	const x = ingredient.massFraction;
	if (typeof x !== 'number' || !Number.isFinite(x) || x < 0 || x > 1) {
		throw new ChemistryInputError(
			`Mass fraction of ${label} must be from 0 to 1 g per g of solution (it is ${x}).`,
			{ field: `${field}.massFraction` }
		);
	}
	if (!Array.isArray(ingredient.hazards)) {
		throw new ChemistryInputError(`Hazard statements of ${label} must be a list.`, {
			field: `${field}.hazards`
		});
	}
	ingredient.hazards.forEach((hazard, j) => {
		if (typeof hazard?.code !== 'string' || hazard.code.trim() === '') {
			throw new ChemistryInputError(`Hazard statement ${j + 1} of ${label} has no code.`, {
				field: `${field}.hazards.${j}.code`
			});
		}
	});
	const estimates = ingredient.acuteToxicityEstimates ?? {};
	for (const [key, value] of Object.entries(estimates)) {
		if (
			value !== undefined &&
			!(typeof value === 'number' && Number.isFinite(value) && value > 0)
		) {
			throw new ChemistryInputError(
				`Acute toxicity estimate (${key}) of ${label} must be a number above 0 (it is ${value}).`,
				{ field: `${field}.acuteToxicityEstimates.${key}` }
			);
		}
	}
}

function round(x: number): number {
	return Number(x.toPrecision(4));
}
