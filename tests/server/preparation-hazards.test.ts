// What a technician handles at each step, and its GHS hazards there, on the demo's recipes: a
// component as weighed (the pure substance), a stock as dosed (the stock at its own strength), the
// pH step's acid or base, and the finished solution. Check values from the UN GHS (Rev. 10) mixture
// rules as chemistry/hazards applies them; the arithmetic is shown beside each.
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { recipe } from '$lib/server/db/schema';
import { preparationHazards } from '$lib/server/batches/preparation-hazards';
import { currentApprovedVersion, latestVersion, linesOf } from '$lib/server/recipes/queries';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

function preparationOf(recipeName: string) {
	const found = db.select().from(recipe).where(eq(recipe.name, recipeName)).get()!;
	const version = (currentApprovedVersion(found.id) ?? latestVersion(found.id))!;
	const lines = linesOf(version.id).map((l) => ({
		id: l.id,
		kind: l.kind,
		componentId: l.shelfFormId ?? l.componentId,
		stockRecipeId: l.stockRecipeId,
		name: l.componentId ?? l.stockRecipeId ?? ''
	}));
	return { prepared: preparationHazards(version, lines), lines };
}

const codesOf = (set: { statements: { code: string }[] }) => set.statements.map((s) => s.code);

describe('the hazards of each step of a preparation', () => {
	it('gives a weighed component its own statements, pictograms and equipment', () => {
		const { prepared, lines } = preparationOf('PPN Trace Elements T2');
		const selenite = lines.find((l) => l.componentId === 'sodium-selenite')!;
		const set = prepared.lines[selenite.id];
		// Weighed as the pure powder: everything its label carries (chemistry/data/components.ts).
		expect(codesOf(set)).toEqual(['H300']);
		expect(set.signalWord).toBe('Danger');
		expect(set.pictograms).toEqual(['GHS06']);
		// Cobalt chloride's H334 and H350i (inhalation) call for the fume hood while it is weighed.
		expect(prepared.fumeHood).toContain('cobalt-ii-chloride-hexahydrate');
		expect(prepared.fumeHood).not.toContain('boric-acid');
		expect(prepared.ppe.map((p) => p.id)).toEqual(expect.arrayContaining(['gloves']));
	});

	it('gives a trace stock dosed at 1 mL/L only what it carries at its own strength', () => {
		const { prepared, lines } = preparationOf('NB-Min Salts 3');
		const stock = lines.find((l) => l.kind === 'stock');
		expect(stock).toBeDefined();
		const codes = codesOf(prepared.lines[stock!.id]);
		// Sodium selenite 0.012 g/L in the stock: 1.2e-5 g/g. Oral cat 2 converted ATE 5 mg/kg
		// (GHS table 3.1.2): ATEmix = 5 / 1.2e-5 ≈ 417,000 mg/kg, far above 2000: not classified.
		expect(codes).not.toContain('H300');
		// Cobalt chloride 0.12 g/L: 0.012 % < 0.1 %, the carcinogen cat 1 limit (GHS table 3.6.1).
		expect(codes).not.toContain('H350i');
		// The medium itself, at 1 mL/L of that stock, carries none of the trace metals' statements.
		expect(codesOf(prepared.finished)).not.toEqual(
			expect.arrayContaining(['H300', 'H350i', 'H341', 'H360FD'])
		);
	});

	it('names the pH step’s base with its cautions, and says so when the instructions name none', () => {
		const broth = preparationOf('PPN Yeast Extract Broth Y5').prepared;
		const [base] = broth.ph!.agents;
		expect(base.name).toBe('Sodium hydroxide');
		// 1 M NaOH: pH 14 ≥ 11.5, the extreme-pH criterion for skin corrosion (GHS 3.2.3.1.2).
		expect(codesOf(base.hazards)).toContain('H314');
		expect(base.hazards.pictograms).toContain('GHS05');
		expect(base.hazards.ppe.map((p) => p.id)).toEqual(
			expect.arrayContaining(['gloves', 'eye-protection', 'face-shield'])
		);
		expect(broth.ppe.map((p) => p.id)).toContain('face-shield');

		const yeast = preparationOf('PPN Yeast-Glycerol A').prepared;
		expect(yeast.ph!.agents.map((a) => a.name)).toEqual(['Ammonia solution']);

		const basal = preparationOf('PPN CD Basal M1').prepared;
		expect(basal.ph!.agents).toEqual([]);
		expect(basal.ph!.unnamed).toMatch(/name no acid or base/);
	});

	it('keeps our own notices in plain words, apart from the GHS statements', () => {
		const broth = preparationOf('PPN Yeast Extract Broth Y5').prepared;
		expect(broth.notices).toEqual([
			{ id: 'hot', text: expect.stringMatching(/^Hot liquid: .*scald/) }
		]);
		const allCodes = [...Object.values(broth.lines).flatMap(codesOf), ...codesOf(broth.finished)];
		expect(allCodes.every((code) => /^H\d{3}/.test(code))).toBe(true);
	});
});
