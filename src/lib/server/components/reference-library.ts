import { REFERENCE_COMPONENTS, type ReferenceComponent } from '$chemistry';
import { db } from '../db';
import { component } from '../db/schema';

// Common practice for keeping raw materials, by kind; the supplier's label and site procedures decide.
const STORAGE_BY_CATEGORY: Record<string, string> = {
	salt: 'Room temperature, dry, container closed (common practice)',
	'trace-metal': 'Room temperature, dry, container closed (common practice)',
	sugar: 'Room temperature, dry (common practice)',
	polyol: 'Room temperature, container closed; hygroscopic (common practice)',
	'amino-acid': 'Room temperature, dry (common practice)',
	vitamin: '2–8 °C, dry, protected from light (common practice)',
	buffer: 'Room temperature, dry (common practice)',
	complex: 'Room temperature, dry, container closed; hygroscopic (common practice)',
	other: 'As on the supplier label (common practice)'
};

function rowOf(reference: ReferenceComponent): typeof component.$inferInsert {
	return {
		id: reference.id,
		name: reference.name,
		category: reference.category,
		formula: reference.formula,
		molarMassGPerMol: reference.molarMassGPerMol,
		casNumber: reference.casNumber ?? null,
		elementalMassFractions: reference.elementalMassFractions ?? null,
		fractionsNote: reference.fractionsNote ?? null,
		ions: reference.ions ?? null,
		osmoticCoefficient: reference.osmoticCoefficient,
		osmoticCoefficientSource: reference.osmoticCoefficientSource,
		solubility: reference.solubility ?? null,
		ghsHazards: reference.ghsHazards ?? [],
		hazardSource: reference.hazardSource ?? null,
		storage: STORAGE_BY_CATEGORY[reference.category] ?? '',
		basisComponentId: reference.anhydrousId ?? reference.freeFormId ?? null,
		synonyms: reference.synonyms ?? [],
		fromReference: true
	};
}

/**
 * Loads the reference components as the starting library. Idempotent: a component already present
 * (by id) is left as it is, edits included. Returns how many it added.
 */
export function seedReferenceLibrary(): number {
	return db.transaction((tx) => {
		const present = new Set(
			tx
				.select({ id: component.id })
				.from(component)
				.all()
				.map((r) => r.id)
		);
		// Basis forms first, so each row's basis reference already exists.
		const ordered = [...REFERENCE_COMPONENTS].sort(
			(a, b) =>
				Number(Boolean(a.anhydrousId ?? a.freeFormId)) -
				Number(Boolean(b.anhydrousId ?? b.freeFormId))
		);
		let added = 0;
		for (const reference of ordered) {
			if (present.has(reference.id)) continue;
			tx.insert(component).values(rowOf(reference)).onConflictDoNothing().run();
			added++;
		}
		return added;
	});
}
