import { parseFormula } from '$chemistry';

/** What the form of a component is read from. */
export interface FormFacts {
	id: string;
	name: string;
	formula: string | null;
	category: string;
	densityGPerMl: number | null;
}

// The numerical prefixes of IUPAC names, with hemi- and sesqui- as hydrate names use them (from memory).
const COUNT_PREFIXES: Record<number, string> = {
	0.5: 'hemi',
	1: 'mono',
	1.5: 'sesqui',
	2: 'di',
	3: 'tri',
	4: 'tetra',
	5: 'penta',
	6: 'hexa',
	7: 'hepta',
	8: 'octa',
	9: 'nona',
	10: 'deca',
	12: 'dodeca'
};

function counted(n: number, word: string): string {
	const prefix = COUNT_PREFIXES[n];
	return prefix ? `${prefix}${word}` : `${word} (${n})`;
}

/** The adducts after the first part of a formula ("·7H2O", "·HCl"), by what they are. */
function adductsOf(formula: string): { water: number; hydrogenChloride: number } {
	let water = 0;
	let hydrogenChloride = 0;
	try {
		for (const part of parseFormula(formula).parts.slice(1)) {
			if (part.formula === 'H2O') water += part.multiplier;
			if (part.formula === 'HCl') hydrogenChloride += part.multiplier;
		}
	} catch {
		// A formula the parser refuses names no form; the library form shows the refusal itself.
	}
	return { water, hydrogenChloride };
}

function formLabel(c: FormFacts, hydrateBases: Set<string>): string | null {
	if (!c.formula) return c.category === 'complex' ? 'complex, no formula' : 'no formula';
	const { water, hydrogenChloride } = adductsOf(c.formula);
	const words: string[] = [];
	if (/\bsolution\b/i.test(c.name)) words.push('solution');
	else if (c.densityGPerMl !== null) words.push('liquid');
	if (hydrogenChloride)
		words.push(
			hydrogenChloride === 1 ? 'hydrochloride' : counted(hydrogenChloride, 'hydrochloride')
		);
	if (water) words.push(counted(water, 'hydrate'));
	else if (/\banhydrous\b/i.test(c.name) || hydrateBases.has(c.id)) words.push('anhydrous');
	return words.length ? words.join(', ') : null;
}

/**
 * Each component's form in a few words, for choosing between forms of one substance: a hydrate
 * ("heptahydrate"), its anhydrous salt (named so, or the basis of a hydrate in the library), a
 * hydrochloride, a solution or a liquid kept by volume, a complex material without a formula; null
 * when nothing sets the component apart.
 */
export function formLabelsOf(
	components: readonly (FormFacts & { basisComponentId: string | null })[]
): Map<string, string | null> {
	const hydrateBases = new Set(
		components.flatMap((c) =>
			c.basisComponentId && c.formula && adductsOf(c.formula).water ? [c.basisComponentId] : []
		)
	);
	return new Map(components.map((c) => [c.id, formLabel(c, hydrateBases)]));
}
