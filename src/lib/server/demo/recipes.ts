import { eq } from 'drizzle-orm';
import {
	blankLine,
	type DraftFieldsInput,
	type DraftLineInput,
	type RecipeKind
} from '$lib/recipes';
import { db } from '../db';
import { recipe } from '../db/schema';
import { findUserByEmail, rolesOf } from '../people';
import { checkDraft } from '../recipes/draft';
import { createRecipe, saveDraft, startDraftFrom } from '../recipes/drafts';
import { findVersion } from '../recipes/queries';
import { signVersion, submitForReview } from '../recipes/workflow';
import { demoAcknowledgements } from './acknowledgements';
import { DEMO_PASSWORD } from './accounts';

/*
 * Invented recipes of Pilot Plant North. None copies a published named medium: the compositions
 * were chosen for this demo, in realistic ranges.
 */

type Line = [
	componentId: string,
	amount: number,
	unit: string,
	note?: string,
	shelfFormId?: string
];

interface DemoRecipe {
	name: string;
	kind: RecipeKind;
	fields: Partial<DraftFieldsInput>;
	lines: Line[];
	stocks?: [stockName: string, mlPerL: number, note?: string][];
	/** The end state: approved (signed by the engineer), in review, or left a draft. */
	state: 'approved' | 'in_review' | 'draft';
	/** Approve version 1, then start version 2 as a draft with these changes. */
	nextDraft?: { changeNote: string; lines: Line[] };
}

const TRACE = 'PPN Trace Elements T2';

export const DEMO_RECIPES: DemoRecipe[] = [
	{
		name: TRACE,
		kind: 'stock_solution',
		state: 'approved',
		fields: {
			targetPh: '2.5',
			preparationTemperatureC: '25',
			shelfLifeDays: '180',
			storage: '2–8 °C, dark bottle',
			instructions:
				'Dissolve the citrate in 800 mL purified water first; it holds the metals in solution. Add the salts one at a time in the order listed, each dissolved before the next. Make up to 1 L, filter through 0.2 µm into a dark bottle. Dose at 1 mL per litre unless the recipe says otherwise.',
			changeNote: 'First issue.'
		},
		lines: [
			['trisodium-citrate-dihydrate', 10, 'g/L', 'Chelator: dissolve first'],
			['iron-ii-sulfate-heptahydrate', 4.2, 'g/L'],
			['zinc-sulfate-heptahydrate', 1.1, 'g/L'],
			['manganese-ii-sulfate-monohydrate', 0.75, 'g/L'],
			['copper-ii-sulfate-pentahydrate', 0.16, 'g/L'],
			['cobalt-ii-chloride-hexahydrate', 0.12, 'g/L'],
			['sodium-molybdate-dihydrate', 0.09, 'g/L'],
			['boric-acid', 0.25, 'g/L'],
			['sodium-selenite', 0.012, 'g/L', 'Toxic: weigh in the fume cupboard']
		]
	},
	{
		name: 'NB-Min Salts 3',
		kind: 'basal',
		state: 'approved',
		fields: {
			targetPh: '7.0',
			osmolalityMinMOsmPerKg: '220',
			osmolalityMaxMOsmPerKg: '320',
			preparationTemperatureC: '25',
			shelfLifeDays: '30',
			storage: 'Room temperature, closed, away from light',
			instructions:
				'Defined mineral-salts medium for the production bacterium. Dissolve the phosphates and ammonium sulfate in 900 mL purified water, adjust to pH 7.0, make up to volume and autoclave. Glucose and magnesium sulfate are autoclaved apart as 10× solutions and added cold; the trace stock goes in last through a 0.2 µm filter.',
			changeNote: 'First issue.'
		},
		lines: [
			['dipotassium-hydrogen-phosphate', 7.5, 'g/L'],
			['potassium-dihydrogen-phosphate', 2.2, 'g/L'],
			['ammonium-sulfate', 2.4, 'g/L'],
			['sodium-chloride', 0.6, 'g/L'],
			['d-glucose', 12, 'g/L', 'Autoclave apart as a 10× solution'],
			[
				'magnesium-sulfate',
				2,
				'mM',
				'Weighed as the heptahydrate; add after autoclaving',
				'magnesium-sulfate-heptahydrate'
			]
		],
		stocks: [[TRACE, 1, 'Filter-sterilised, added last']]
	},
	{
		name: 'PPN Yeast Extract Broth Y5',
		kind: 'basal',
		state: 'approved',
		fields: {
			targetPh: '7.2',
			osmolalityMinMOsmPerKg: '150',
			osmolalityMaxMOsmPerKg: '350',
			preparationTemperatureC: '40',
			shelfLifeDays: '60',
			storage: 'Room temperature',
			instructions:
				'Complex medium for seed trains of the bacterium. Dissolve in warm purified water (about 40 °C) with stirring, adjust pH to 7.2 with NaOH, autoclave 20 min at 121 °C. Let it cool before handling: hot media scald.',
			changeNote: 'First issue.'
		},
		lines: [
			['yeast-extract', 8, 'g/L', 'Complex: composition from typical values'],
			['soy-peptone', 12, 'g/L'],
			['sodium-chloride', 4, 'g/L'],
			['dipotassium-hydrogen-phosphate', 1.5, 'g/L'],
			['d-glucose', 2.5, 'g/L']
		],
		nextDraft: {
			changeNote: 'More glucose for a denser seed; less salt.',
			lines: [
				['yeast-extract', 8, 'g/L', 'Complex: composition from typical values'],
				['soy-peptone', 12, 'g/L'],
				['sodium-chloride', 3, 'g/L'],
				['dipotassium-hydrogen-phosphate', 1.5, 'g/L'],
				['d-glucose', 5, 'g/L']
			]
		}
	},
	{
		name: 'PPN Yeast-Glycerol A',
		kind: 'basal',
		state: 'in_review',
		fields: {
			targetPh: '5.0',
			osmolalityMinMOsmPerKg: '500',
			osmolalityMaxMOsmPerKg: '750',
			preparationTemperatureC: '25',
			shelfLifeDays: '30',
			storage: 'Room temperature',
			instructions:
				'Glycerol-based salts medium for the yeast. Dissolve the salts, add glycerol, adjust pH to 5.0 with ammonia solution (corrosive: fume cupboard, goggles), autoclave. Add biotin and the trace stock through a 0.2 µm filter after cooling.',
			changeNote: 'First issue.'
		},
		lines: [
			['glycerol', 40, 'g/L'],
			['ammonium-sulfate', 5, 'g/L'],
			['potassium-dihydrogen-phosphate', 3, 'g/L'],
			['magnesium-sulfate-heptahydrate', 1, 'g/L'],
			['potassium-sulfate', 0.6, 'g/L'],
			['calcium-chloride-dihydrate', 0.05, 'g/L'],
			['d-biotin', 0.4, 'mg/L', 'From a filtered 0.2 g/L solution']
		],
		stocks: [[TRACE, 2]]
	},
	{
		name: 'PPN CD Basal M1',
		kind: 'basal',
		state: 'approved',
		fields: {
			targetPh: '7.1',
			osmolalityMinMOsmPerKg: '270',
			osmolalityMaxMOsmPerKg: '330',
			preparationTemperatureC: '25',
			shelfLifeDays: '45',
			storage: '2–8 °C, protected from light',
			instructions:
				'Chemically defined basal for the mammalian cell line. Add components in the order listed to 850 mL cell-culture grade water, each dissolved before the next; bicarbonate last. Adjust to pH 7.1, make up to volume, filter through 0.2 µm. Measure osmolality before release.',
			changeNote: 'First issue.'
		},
		lines: [
			['sodium-chloride', 5.2, 'g/L'],
			['potassium-chloride', 0.33, 'g/L'],
			['sodium-dihydrogen-phosphate-monohydrate', 0.11, 'g/L'],
			['magnesium-sulfate', 0.09, 'g/L', undefined, 'magnesium-sulfate-heptahydrate'],
			['calcium-chloride-dihydrate', 0.14, 'g/L'],
			['d-glucose', 5, 'g/L'],
			['hepes', 2.6, 'g/L'],
			['sodium-pyruvate', 0.1, 'g/L'],
			['l-glutamine', 4, 'mM', 'Add fresh; unstable in solution'],
			['l-arginine-hydrochloride', 0.12, 'g/L'],
			['l-lysine-hydrochloride', 0.16, 'g/L'],
			['l-leucine', 0.13, 'g/L'],
			['l-isoleucine', 0.11, 'g/L'],
			['l-valine', 0.11, 'g/L'],
			['l-threonine', 0.09, 'g/L'],
			['l-phenylalanine', 0.07, 'g/L'],
			['l-methionine', 0.035, 'g/L'],
			['l-tryptophan', 0.018, 'g/L'],
			['l-histidine-hydrochloride-monohydrate', 0.05, 'g/L'],
			['l-serine', 0.06, 'g/L'],
			['glycine', 0.03, 'g/L'],
			['l-tyrosine-disodium-salt-dihydrate', 0.11, 'g/L'],
			['l-cystine-dihydrochloride', 0.07, 'g/L'],
			['choline-chloride', 8, 'mg/L'],
			['folic-acid', 1.2, 'mg/L', 'Sparingly soluble: dissolve in a little dilute NaOH first'],
			['nicotinamide', 3, 'mg/L'],
			['pyridoxine-hydrochloride', 2, 'mg/L'],
			['riboflavin', 0.3, 'mg/L', 'Protect from light'],
			['thiamine-hydrochloride', 3.5, 'mg/L'],
			['d-calcium-pantothenate', 3, 'mg/L'],
			['myo-inositol', 10, 'mg/L'],
			['sodium-bicarbonate', 2.0, 'g/L', 'Last']
		],
		stocks: [[TRACE, 0.5]]
	},
	{
		name: 'PPN Feed GA-12',
		kind: 'feed',
		state: 'draft',
		fields: {
			targetPh: '7.0',
			osmolalityMinMOsmPerKg: '1500',
			osmolalityMaxMOsmPerKg: '2200',
			preparationTemperatureC: '25',
			shelfLifeDays: '14',
			storage: '2–8 °C',
			instructions:
				'Concentrated glucose and amino-acid feed for the mammalian fed-batch. Dissolve the amino acids in 600 mL warm water, then the glucose. Known problem in this draft: free tyrosine at 3 g/L does not dissolve at neutral pH; the next version should move it to a separate alkaline feed as the disodium salt.',
			changeNote: 'First draft.'
		},
		lines: [
			['d-glucose', 250, 'g/L'],
			['l-leucine', 8, 'g/L'],
			['l-isoleucine', 5, 'g/L'],
			['l-valine', 5, 'g/L'],
			['l-lysine-hydrochloride', 8, 'g/L'],
			['l-threonine', 4, 'g/L'],
			['l-phenylalanine', 3, 'g/L'],
			['l-methionine', 2, 'g/L'],
			['l-serine', 6, 'g/L'],
			['l-proline', 4, 'g/L'],
			['l-tyrosine', 3, 'g/L', 'Above its solubility at neutral pH']
		]
	}
];

function draftOf(
	fields: Partial<DraftFieldsInput>,
	lines: Line[],
	stocks: DemoRecipe['stocks'],
	stockIds: Map<string, string>
) {
	const draftLines: DraftLineInput[] = lines.map(
		([componentId, amount, unit, note, shelfFormId]) => ({
			...blankLine('component'),
			componentId,
			shelfFormId: shelfFormId ?? '',
			amount: String(amount),
			unit,
			note: note ?? ''
		})
	);
	for (const [name, ml, note] of stocks ?? []) {
		draftLines.push({
			...blankLine('stock'),
			stockRecipeId: stockIds.get(name)!,
			amount: String(ml),
			note: note ?? ''
		});
	}
	const allFields: DraftFieldsInput = {
		targetPh: '',
		osmolalityMinMOsmPerKg: '',
		osmolalityMaxMOsmPerKg: '',
		preparationTemperatureC: '25',
		shelfLifeDays: '',
		storage: '',
		instructions: '',
		changeNote: '',
		...fields
	};
	return { fields: allFields, lines: draftLines };
}

/** Adds the demo recipes that are missing (by name); returns how many. */
export async function seedDemoRecipes(): Promise<number> {
	const author = findUserByEmail('scientist@demo.test');
	const approverUser = findUserByEmail('engineer@demo.test');
	if (!author || !approverUser) return 0;
	const actor = { id: author.id, email: author.email };
	const approver = {
		id: approverUser.id,
		email: approverUser.email,
		roles: rolesOf(approverUser.id)
	};
	const ids = new Map<string, string>();
	let added = 0;
	for (const demo of DEMO_RECIPES) {
		const existing = db.select().from(recipe).where(eq(recipe.name, demo.name)).get();
		if (existing) {
			ids.set(demo.name, existing.id);
			continue;
		}
		const recipeId = createRecipe(actor, { name: demo.name, kind: demo.kind });
		ids.set(demo.name, recipeId);
		const version = findVersion(recipeId, 1)!;
		const checked = checkDraft(draftOf(demo.fields, demo.lines, demo.stocks, ids), recipeId);
		if (!checked.ok)
			throw new Error(
				`Demo recipe ${demo.name} is invalid: ${JSON.stringify(checked.fieldErrors)}`
			);
		const revision = saveDraft(actor, version.id, version.revision, checked.value);
		if (demo.state !== 'draft') submitForReview(actor, version.id, revision);
		if (demo.state === 'approved') {
			await signVersion(approver, version.id, {
				password: DEMO_PASSWORD,
				meaning: 'approved',
				comment: 'Checked against the target range; fine for use.',
				acknowledgements: demoAcknowledgements(version.id)
			});
		}
		if (demo.nextDraft) {
			const next = startDraftFrom(actor, version.id);
			const nextChecked = checkDraft(
				draftOf(
					{ ...demo.fields, changeNote: demo.nextDraft.changeNote },
					demo.nextDraft.lines,
					demo.stocks,
					ids
				),
				recipeId
			);
			if (!nextChecked.ok)
				throw new Error(
					`Demo recipe ${demo.name} v2 is invalid: ${JSON.stringify(nextChecked.fieldErrors)}`
				);
			saveDraft(actor, next.id, next.revision, nextChecked.value);
		}
		added++;
	}
	return added;
}
