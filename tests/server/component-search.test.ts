// The picker's search over the reference library the app loads at start (chemistry/data/components.ts):
// the expected components are found in that table by what they are, never by a hard-coded rank.
import { describe, expect, it } from 'vitest';
import { REFERENCE_COMPONENTS } from '$chemistry';
import {
	componentNamedBy,
	indexComponents,
	searchComponents,
	type SearchableComponent
} from '$lib/component-search';

const library: SearchableComponent[] = REFERENCE_COMPONENTS.map((c) => ({
	id: c.id,
	name: c.name,
	formula: c.formula,
	casNumber: c.casNumber ?? null,
	synonyms: c.synonyms ?? []
}));
const index = indexComponents(library);

const byFormula = (formula: string) => library.filter((c) => c.formula === formula);
const search = (query: string, limit?: number) => searchComponents(index, query, limit);

describe('finding a component by what people type', () => {
	it('finds potassium chloride by its formula as the list shows it', () => {
		const [potassiumChloride] = byFormula('KCl');
		const [first] = search('KCl');
		expect(first.component.id).toBe(potassiumChloride.id);
		expect(first).toMatchObject({ field: 'formula', kind: 'exact', matchedText: 'KCl' });
	});

	it('prefers the formula as written over a match that ignores case', () => {
		// An invented component whose synonym is "kcl" in lower case: an exact-case formula wins.
		const withLookalike = indexComponents([
			...library,
			{ id: 'kcl-buffer', name: 'Demo buffer', formula: null, casNumber: null, synonyms: ['kcl'] }
		]);
		const found = searchComponents(withLookalike, 'KCl').map((m) => m.component.id);
		expect(found.slice(0, 2)).toEqual([byFormula('KCl')[0].id, 'kcl-buffer']);
	});

	it('finds glucose by its common name, whatever the library calls the entry', () => {
		const anhydrousGlucose = library.find(
			(c) => /glucose/i.test(c.name) && c.formula === 'C6H12O6'
		)!;
		const monohydrate = library.find(
			(c) => /glucose/i.test(c.name) && c.formula === 'C6H12O6·H2O'
		)!;
		const found = search('Glucose').map((m) => m.component.id);
		expect(found[0]).toBe(anhydrousGlucose.id);
		expect(found).toContain(monohydrate.id);
	});

	it('forgives a typo and ranks the intended component first', () => {
		const sodiumChloride = byFormula('NaCl')[0];
		const [first, ...others] = search('Sodium chlorde');
		expect(first.component.id).toBe(sodiumChloride.id);
		expect(first.kind).toBe('fuzzy');
		expect(others.map((m) => m.component.id)).not.toContain(sodiumChloride.id);
	});

	it('finds a component by its CAS number, with or without the hyphens', () => {
		const potassiumChloride = byFormula('KCl')[0];
		const cas = potassiumChloride.casNumber!;
		expect(search(cas)[0]).toMatchObject({ field: 'cas', kind: 'exact', matchedText: cas });
		expect(search(cas)[0].component.id).toBe(potassiumChloride.id);
		expect(search(cas.replace(/-/g, ''))[0].component.id).toBe(potassiumChloride.id);
	});

	it('finds a component by a synonym and says which synonym matched', () => {
		const withSynonym = library.find((c) => c.synonyms.includes('Epsom salt'))!;
		expect(search('epsom salt')[0]).toMatchObject({
			component: { id: withSynonym.id },
			field: 'synonym',
			matchedText: 'Epsom salt'
		});
	});

	it('reads a hydrate written with a plain dot as the adduct dot', () => {
		const [heptahydrate] = byFormula('MgSO4·7H2O');
		expect(search('MgSO4.7H2O')[0].component.id).toBe(heptahydrate.id);
	});

	it('lists exact matches, then names starting with the text, then typos', () => {
		const found = search('Sodium chloride', 20);
		expect(found[0]).toMatchObject({ component: byFormula('NaCl')[0], kind: 'exact' });
		const kinds = found.map((m) => m.kind);
		expect(kinds.indexOf('fuzzy')).toBeGreaterThan(0);
		expect(kinds.slice(kinds.indexOf('fuzzy')).every((k) => k === 'fuzzy')).toBe(true);
		// Every word typed is the start of a word in the name: "mag sulf".
		const magnesiumSulfates = library.filter((c) => /^Magnesium sulfate/.test(c.name));
		expect(
			search('mag sulf')
				.slice(0, magnesiumSulfates.length)
				.map((m) => m.component.id)
				.sort()
		).toEqual(magnesiumSulfates.map((c) => c.id).sort());
	});

	it('gives nothing for an empty query and nothing for a text like no component', () => {
		expect(search('')).toEqual([]);
		expect(search('   ')).toEqual([]);
		expect(search('unobtainium')).toEqual([]);
		expect(search('KCl', 0)).toEqual([]);
	});

	it('keeps to the limit asked for', () => {
		expect(search('sodium', 3)).toHaveLength(3);
		expect(search('sodium', 100).length).toBeGreaterThan(3);
	});
});

describe('a text that names a component outright', () => {
	it('is its id or its name in any case, and nothing else', () => {
		const sodiumChloride = byFormula('NaCl')[0];
		expect(componentNamedBy(index, sodiumChloride.name.toUpperCase())?.id).toBe(sodiumChloride.id);
		expect(componentNamedBy(index, ` ${sodiumChloride.id} `)?.id).toBe(sodiumChloride.id);
		expect(componentNamedBy(index, 'NaCl')).toBeUndefined();
		expect(componentNamedBy(index, '')).toBeUndefined();
	});
});
