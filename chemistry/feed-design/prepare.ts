// Checking the feed designer's input and preparing each candidate (elements, solubility, which side of a precipitation pair it is on).
import { ChemistryInputError } from '../errors';
import { resolveComponent, solubilityAt } from '../components';
import { PRECIPITATION_RULES, precipitationSpeciesOf } from '../composition';
import { type FeedCandidate, type FeedDesignInput, type Prepared } from './types';

export const CATION_SPECIES = new Set<string>(PRECIPITATION_RULES.map((r) => r.cation));

export const ANION_SPECIES = new Set<string>(PRECIPITATION_RULES.map((r) => r.anion));

export function round3(value: number): string {
	return Number(value.toPrecision(3)).toString();
}

export function ceilFigures(value: number, figures: number): number {
	if (value <= 0) return 0;
	const step = 10 ** (Math.floor(Math.log10(value)) - figures + 1);
	return Number((Math.ceil(value / step - 1e-9) * step).toPrecision(figures));
}

export function listWords(words: string[], joiner = 'and'): string {
	if (words.length <= 1) return words.join('');
	return `${words.slice(0, -1).join(', ')} ${joiner} ${words[words.length - 1]}`;
}

export function finite(
	value: unknown,
	field: string,
	what: string,
	{ min, max, strict }: { min: number; max?: number; strict?: boolean }
): number {
	const ok =
		typeof value === 'number' &&
		Number.isFinite(value) &&
		(strict ? value > min : value >= min) &&
		(max === undefined || value <= max);
	if (!ok) {
		const range =
			max === undefined
				? `${strict ? 'greater than' : 'at least'} ${min}`
				: `from ${min} to ${max}`;
		throw new ChemistryInputError(`${what} must be a number ${range}`, { field });
	}
	return value as number;
}

export function prepare(candidate: FeedCandidate, index: number, temperatureC: number): Prepared {
	const field = `candidates.${index}`;
	if (!candidate || typeof candidate !== 'object')
		throw new ChemistryInputError('Candidate is missing', { field });
	const resolved = resolveComponent(candidate.component, `${field}.component`);
	const content = new Map<string, number>([[resolved.spec.id, 1]]);
	resolved.elementSymbols.forEach((symbol, i) => {
		if (resolved.elementGPerG[i] > 0) content.set(symbol, resolved.elementGPerG[i]);
	});
	const basis = candidate.basis;
	if (basis && resolved.molarMassGPerMol !== null) {
		finite(
			basis.molarMassGPerMol,
			`${field}.basis.molarMassGPerMol`,
			'Molar mass of the basis form',
			{ min: 0, strict: true }
		);
		content.set(basis.id, basis.molarMassGPerMol / resolved.molarMassGPerMol);
	}
	let solubilityGPerL: number | null = null;
	if (resolved.solubility) {
		const limit = solubilityAt(resolved.solubility.points, temperatureC).gPerL;
		const { basisMolarMassGPerMol } = resolved.solubility;
		// The library states it for the basis form; computeComposition compares on that basis too.
		solubilityGPerL =
			basisMolarMassGPerMol !== null && resolved.molarMassGPerMol !== null
				? (limit / basisMolarMassGPerMol) * resolved.molarMassGPerMol
				: limit;
	}
	const counted = resolved.molarMassGPerMol !== null && resolved.particlesPerUnit !== null;
	const species = new Set(
		counted ? precipitationSpeciesOf(resolved.ions).map((s) => s.species) : []
	);
	const cation = [...species].some((s) => CATION_SPECIES.has(s));
	const anion = [...species].some((s) => ANION_SPECIES.has(s));
	return {
		index,
		spec: resolved.spec,
		content,
		solubilityGPerL,
		osmolalityPerGPerL: counted
			? (1000 * resolved.particlesPerUnit! * resolved.osmoticCoefficient) /
				resolved.molarMassGPerMol!
			: 0,
		hasMolarMass: resolved.molarMassGPerMol !== null,
		species,
		side: cation && anion ? 'both' : cation ? 'cation' : anion ? 'anion' : 'neutral'
	};
}

export function checkInput(input: FeedDesignInput) {
	if (!input || typeof input !== 'object')
		throw new ChemistryInputError('The design input is missing', { field: '(input)' });
	if (!Array.isArray(input.candidates) || input.candidates.length === 0) {
		throw new ChemistryInputError('Choose at least one component for the feed', {
			field: 'candidates'
		});
	}
	if (!Array.isArray(input.needs))
		throw new ChemistryInputError('Needs must be a list', { field: 'needs' });
	input.needs.forEach((n, i) => {
		if (!n || typeof n.key !== 'string' || !n.key)
			throw new ChemistryInputError('A need names its nutrient', { field: `needs.${i}.key` });
		finite(n.requiredGPerLFinal, `needs.${i}.requiredGPerLFinal`, `Requirement of ${n.key}`, {
			min: 0
		});
		finite(n.presentG, `needs.${i}.presentG`, `Basal supply of ${n.key}`, { min: 0 });
	});
	finite(input.initialVolumeL, 'initialVolumeL', 'Initial volume (L)', { min: 0, strict: true });
	finite(input.maxFeedVolumeL, 'maxFeedVolumeL', 'Room left for feed (L)', { min: 0 });
	finite(input.feedVolumeL, 'feedVolumeL', 'Feed volume (L)', { min: 0, strict: true });
	if (input.feedVolumeL > input.maxFeedVolumeL * (1 + 1e-12)) {
		throw new ChemistryInputError(
			`Feed volume (L) must be at most the ${round3(input.maxFeedVolumeL)} L left in the vessel`,
			{ field: 'feedVolumeL' }
		);
	}
	finite(input.temperatureC, 'temperatureC', 'Feed temperature (°C)', { min: -10, max: 100 });
	finite(input.osmolalityMaxMOsmPerKg, 'osmolalityMaxMOsmPerKg', 'Osmolality limit (mOsm/kg)', {
		min: 0,
		strict: true
	});
	finite(input.dissolvedSolidsMaxGPerL, 'dissolvedSolidsMaxGPerL', 'Dissolved-solids limit (g/L)', {
		min: 0,
		strict: true
	});
}
