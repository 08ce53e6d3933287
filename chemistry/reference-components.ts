// The reference components (data/components.ts) by id, name and formula, and their hydrates.
import { REFERENCE_COMPONENT_DATA } from './data/components';
import { molarMassOf, parseFormula } from './formula';
import { type SolubilitySpec, type ReferenceComponent } from './components';

function buildReferenceComponents(): ReferenceComponent[] {
	const byId = new Map(REFERENCE_COMPONENT_DATA.map((d) => [d.id, d]));
	return REFERENCE_COMPONENT_DATA.map((data) => {
		const formula = data.formula ?? null;
		let solubility: SolubilitySpec | null = null;
		if (data.solubilityGPerL25C !== undefined) {
			solubility = {
				points: [
					{ temperatureC: 25, gPerL: data.solubilityGPerL25C },
					...(data.solubilityPoints ?? [])
				],
				basisFormula: data.solubilityBasisFormula ?? null,
				source: data.solubilitySource ?? null
			};
		} else if (data.anhydrousId) {
			// A hydrate shares its anhydrous salt's solubility, compared on the anhydrous basis.
			const anhydrous = byId.get(data.anhydrousId);
			if (anhydrous?.solubilityGPerL25C !== undefined) {
				solubility = {
					points: [
						{ temperatureC: 25, gPerL: anhydrous.solubilityGPerL25C },
						...(anhydrous.solubilityPoints ?? [])
					],
					basisFormula: anhydrous.solubilityBasisFormula ?? anhydrous.formula ?? null,
					source: `${anhydrous.solubilitySource} (value for ${anhydrous.name})`
				};
			}
		}
		const { solubilityPoints: _points, solubilityBasisFormula: _basis, ...rest } = data;
		return {
			...rest,
			formula,
			molarMassGPerMol: formula ? molarMassOf(parseFormula(formula).elements) : null,
			solubility,
			...(data.ghsHazards ? { hazardSource: 'from memory; check the supplier SDS' } : {})
		};
	});
}

export const REFERENCE_COMPONENTS: readonly ReferenceComponent[] = Object.freeze(
	buildReferenceComponents().map((c) => Object.freeze(c))
);

function normalizeName(text: string): string {
	return text
		.toLowerCase()
		.replace(/[\s_·.,()-]+/g, ' ')
		.trim();
}

const lookup = new Map<string, ReferenceComponent>();

// A formula finds a component only when no other reference component shares it (C6H12O6 does not).
const formulaCounts = new Map<string, number>();

for (const component of REFERENCE_COMPONENTS) {
	for (const key of [component.id, component.name, ...(component.synonyms ?? [])]) {
		const normalized = normalizeName(key);
		if (!lookup.has(normalized)) lookup.set(normalized, component);
	}
}
for (const c of REFERENCE_COMPONENTS) {
	if (c.formula)
		formulaCounts.set(
			normalizeName(c.formula),
			(formulaCounts.get(normalizeName(c.formula)) ?? 0) + 1
		);
}
for (const c of REFERENCE_COMPONENTS) {
	const key = c.formula ? normalizeName(c.formula) : null;
	if (key && formulaCounts.get(key) === 1 && !lookup.has(key)) lookup.set(key, c);
}

/** A reference component by id, name, synonym or unshared formula (case and punctuation ignored). */
export function findReferenceComponent(idOrName: string): ReferenceComponent | undefined {
	if (typeof idOrName !== 'string') return undefined;
	return lookup.get(normalizeName(idOrName));
}

/** The hydrates of an anhydrous reference component (MgSO4 → MgSO4·7H2O). */
export function findHydratesOf(anhydrousId: string): ReferenceComponent[] {
	return REFERENCE_COMPONENTS.filter((c) => c.anhydrousId === anhydrousId);
}
