// The server's refusal of an unknown component and the picker's list, read from the demo database.
import { describe, expect, it } from 'vitest';
import { useDemoDatabase } from './demo-database';
import { listComponents } from '$lib/server/components/library';
import { checkDraft } from '$lib/server/recipes/draft';
import { toPickerComponents } from '$lib/server/recipes/editor-data';
import { previewLineCsv } from '$lib/server/recipes/csv';
import { findVersion } from '$lib/server/recipes/queries';
import { EMPTY_FIELDS, line } from './recipes-fixtures';
import { createRecipe } from '$lib/server/recipes/drafts';
import { makeUser } from './helpers';

useDemoDatabase();

const componentError = (text: string) => {
	const checked = checkDraft({ fields: EMPTY_FIELDS, lines: [line(text, 1)] }, null);
	if (checked.ok) throw new Error('expected the line to be refused');
	return checked.fieldErrors['lines.0.componentId'];
};

describe('a component the library does not have', () => {
	it('is refused with the closest components, best first', () => {
		const [message] = componentError('Sodium chlorde');
		expect(message).toMatch(
			/^Line 1: no component “Sodium chlorde” in the library; did you mean Sodium chloride \(NaCl\), .+ or .+\?$/
		);
	});

	it('is refused with the component its formula names, when that was typed instead', () => {
		expect(componentError('KCl')).toEqual([
			'Line 1: no component “KCl” in the library; did you mean Potassium chloride (KCl)?'
		]);
	});

	it('is refused plainly when nothing in the library is close', () => {
		expect(componentError('unobtainium')).toEqual([
			'Line 1: no component “unobtainium” in the library.'
		]);
	});

	it('is refused with suggestions in a CSV of lines too', async () => {
		const author = await makeUser(['media_scientist']);
		const recipeId = createRecipe(author, { name: `Suggestions ${Date.now()}`, kind: 'basal' });
		const preview = previewLineCsv(
			findVersion(recipeId, 1)!,
			'component,amount,unit\nGlucose monohydrat,1,g/L\n',
			'replace'
		);
		expect(preview.rows[0].errors).toEqual([
			expect.stringMatching(
				/^component: no component “Glucose monohydrat” in the library; did you mean D-Glucose monohydrate \(C6H12O6·H2O\)/
			)
		]);
	});
});

describe('the picker’s list of the library', () => {
	const picker = new Map(toPickerComponents(listComponents()).map((c) => [c.id, c]));

	it('says each component’s form: hydrate, anhydrous, hydrochloride, liquid, complex', () => {
		expect(picker.get('magnesium-sulfate-heptahydrate')).toMatchObject({
			formula: 'MgSO4·7H2O',
			category: 'Salt',
			form: 'heptahydrate',
			synonyms: ['Epsom salt']
		});
		expect(picker.get('magnesium-sulfate')?.form).toBe('anhydrous');
		expect(picker.get('l-cysteine-hydrochloride-monohydrate')?.form).toBe(
			'hydrochloride, monohydrate'
		);
		// The demo keeps glycerol by volume (it sets its density).
		expect(picker.get('glycerol')?.form).toBe('liquid');
		expect(picker.get('yeast-extract')).toMatchObject({
			formula: null,
			form: 'complex, no formula'
		});
		expect(picker.get('sodium-chloride')?.form).toBeNull();
	});
});
