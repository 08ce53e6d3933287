import { setSiteDecimalMark } from '$lib/number-reading';
import { describe, expect, it } from 'vitest';
import { blankLine, DRAFT_FIELD_LABELS, type DraftFieldsInput } from '$lib/recipes';
import {
	draftFieldErrors,
	draftFieldsSchema,
	draftSchema,
	MAX_LINES
} from '$lib/recipes/draft-schema';

const BLANK_FIELDS: DraftFieldsInput = {
	targetPh: '',
	osmolalityMinMOsmPerKg: '',
	osmolalityMaxMOsmPerKg: '',
	preparationTemperatureC: '',
	shelfLifeDays: '',
	storage: '',
	instructions: '',
	changeNote: ''
};

function componentLine(amount: string, unit = 'g/L') {
	return { ...blankLine('component'), componentId: 'sodium-chloride', amount, unit };
}

function problemsOf(fields: Partial<DraftFieldsInput>, lines: unknown[] = []) {
	const read = draftSchema.safeParse({ fields: { ...BLANK_FIELDS, ...fields }, lines });
	return read.success ? {} : draftFieldErrors(read.error.issues);
}

describe('the draft schema reads what the editor holds', () => {
	it('reads blank fields as unset, the preparation temperature as the usual 25 °C', () => {
		const read = draftFieldsSchema.parse({
			...BLANK_FIELDS,
			targetPh: ' 7.2 ',
			storage: ' 2–8 °C '
		});
		expect(read).toEqual({
			targetPh: 7.2,
			osmolalityMinMOsmPerKg: null,
			osmolalityMaxMOsmPerKg: null,
			preparationTemperatureC: 25,
			shelfLifeDays: null,
			storage: '2–8 °C',
			instructions: '',
			changeNote: ''
		});
	});

	it('reads a decimal comma only at a comma site, and the unit in its usual spelling', () => {
		const read = () =>
			draftSchema.safeParse({ fields: BLANK_FIELDS, lines: [componentLine('1,5', 'mg/l')] });
		expect(read().success).toBe(false);
		setSiteDecimalMark('comma');
		try {
			const parsed = read();
			expect(parsed.success && parsed.data.lines[0]).toMatchObject({
				amount: 1.5,
				unit: 'mg/L',
				tolerancePercent: 2
			});
		} finally {
			setSiteDecimalMark('point');
		}
	});
});

describe('the draft schema refuses, naming the field by its label', () => {
	it('refuses a target pH outside 0–14', () => {
		const problems = problemsOf({ targetPh: '15' });
		expect(problems.targetPh).toEqual(['Target pH is between 0 and 14, not 15.']);
		expect(problems.targetPh[0]).toContain(DRAFT_FIELD_LABELS.targetPh);
		expect(problemsOf({ targetPh: '14' })).toEqual({});
	});

	it('refuses an osmolality range upside down, beside the other problems', () => {
		const problems = problemsOf({
			targetPh: 'neutral',
			osmolalityMinMOsmPerKg: '400',
			osmolalityMaxMOsmPerKg: '300'
		});
		expect(problems.osmolalityMaxMOsmPerKg).toEqual([
			'Osmolality to (mOsm/kg): the range runs from low to high: 300 is below 400.'
		]);
		expect(problems.osmolalityMaxMOsmPerKg[0]).toContain(DRAFT_FIELD_LABELS.osmolalityMaxMOsmPerKg);
		expect(problems.targetPh).toEqual(['Target pH: “neutral” is not a number.']);
		expect(problemsOf({ osmolalityMinMOsmPerKg: '300', osmolalityMaxMOsmPerKg: '300' })).toEqual(
			{}
		);
	});

	it('refuses a shelf life that is not whole days', () => {
		const problems = problemsOf({ shelfLifeDays: '2.5' });
		expect(problems.shelfLifeDays).toEqual([
			`${DRAFT_FIELD_LABELS.shelfLifeDays} is a whole number.`
		]);
	});

	it('refuses an amount that is not a number, at the line and its amount', () => {
		const problems = problemsOf({}, [
			componentLine('2'),
			componentLine('1,500'),
			componentLine('a lot')
		]);
		expect(problems['lines.0.amount']).toBeUndefined();
		expect(problems['lines.1.amount']).toEqual([
			'Line 2: the amount: “1,500” is ambiguous: it could be 1.5 or 1500. This site writes decimals with a point and no thousands separator: type 1500 or 1.5.'
		]);
		expect(problems['lines.2.amount']).toEqual(['Line 3: the amount: “a lot” is not a number.']);
	});

	it('refuses a unit that does not fit the line’s kind', () => {
		const stockInGramsPerLitre = {
			...blankLine('stock'),
			stockRecipeId: 'trace-stock',
			amount: '1',
			unit: 'g/L'
		};
		const componentInMlPerLitre = { ...componentLine('1', 'mL/L'), componentId: 'glycine' };
		const problems = problemsOf({}, [stockInGramsPerLitre, componentInMlPerLitre]);
		expect(problems['lines.0.unit']?.[0]).toMatch(
			/^Line 1: the unit “g\/L” does not fit a stock line: a stock is dosed in mL\/L/
		);
		expect(problems['lines.1.unit']?.[0]).toMatch(
			/^Line 2: Unknown concentration unit 'mL\/L'; use one of g\/L/
		);
	});

	it(`refuses more than ${MAX_LINES} lines as a whole`, () => {
		const lines = Array.from({ length: MAX_LINES + 1 }, () => componentLine('1'));
		expect(problemsOf({}, lines)).toEqual({
			lines: [`A recipe has at most ${MAX_LINES} lines; this one has ${MAX_LINES + 1}.`]
		});
	});
});
