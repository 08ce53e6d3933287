// Words and constants of recipes shared by server and browser, so this module holds no server code.

export const RECIPE_KINDS = ['basal', 'feed', 'stock_solution', 'supplement'] as const;
export type RecipeKind = (typeof RECIPE_KINDS)[number];

export const RECIPE_KIND_LABELS: Record<RecipeKind, string> = {
	basal: 'Basal medium',
	feed: 'Feed',
	stock_solution: 'Stock solution',
	supplement: 'Supplement'
};

export const VERSION_STATUSES = ['draft', 'in_review', 'approved', 'retired'] as const;
export type VersionStatus = (typeof VERSION_STATUSES)[number];

export const VERSION_STATUS_LABELS: Record<VersionStatus, string> = {
	draft: 'Draft',
	in_review: 'In review',
	approved: 'Approved',
	retired: 'Retired'
};

export const LINE_KINDS = ['component', 'stock'] as const;
export type LineKind = (typeof LINE_KINDS)[number];

/** Concentrations a component line may use: in the finished medium. */
export const LINE_UNITS = ['g/L', 'mg/L', 'mM', 'µM', '% w/v'] as const;
/** A stock line is dosed as millilitres of stock per litre of medium. */
export const STOCK_DOSE_UNIT = 'mL/L';

/** Common practice for a weighing tolerance when the recipe names none. */
export const DEFAULT_TOLERANCE_PERCENT = 2;

export const SIGNATURE_MEANINGS = ['reviewed', 'approved'] as const;
export type SignatureMeaning = (typeof SIGNATURE_MEANINGS)[number];

export const SIGNATURE_MEANING_LABELS: Record<SignatureMeaning, string> = {
	reviewed: 'Reviewed: I have checked this version; it stays in review',
	approved: 'Approved: this version is released for use'
};

/** A line as the editor holds it: text fields as typed, so nothing is lost when the server refuses. */
export interface DraftLineInput {
	kind: LineKind;
	componentId: string;
	shelfFormId: string;
	stockRecipeId: string;
	amount: string;
	unit: string;
	tolerancePercent: string;
	note: string;
}

export function blankLine(kind: LineKind = 'component'): DraftLineInput {
	return {
		kind,
		componentId: '',
		shelfFormId: '',
		stockRecipeId: '',
		amount: '',
		unit: kind === 'stock' ? STOCK_DOSE_UNIT : 'g/L',
		tolerancePercent: String(DEFAULT_TOLERANCE_PERCENT),
		note: ''
	};
}

/** The recipe-level fields of a version as the editor holds them. */
export interface DraftFieldsInput {
	targetPh: string;
	osmolalityMinMOsmPerKg: string;
	osmolalityMaxMOsmPerKg: string;
	preparationTemperatureC: string;
	shelfLifeDays: string;
	storage: string;
	instructions: string;
	changeNote: string;
}

export const DRAFT_FIELD_LABELS: Record<keyof DraftFieldsInput, string> = {
	targetPh: 'Target pH',
	osmolalityMinMOsmPerKg: 'Osmolality from (mOsm/kg)',
	osmolalityMaxMOsmPerKg: 'Osmolality to (mOsm/kg)',
	preparationTemperatureC: 'Preparation temperature (°C)',
	shelfLifeDays: 'Shelf life (days)',
	storage: 'Storage',
	instructions: 'Instructions',
	changeNote: 'What changed in this version'
};

export const COMPONENT_CATEGORIES = [
	'salt',
	'trace-metal',
	'sugar',
	'polyol',
	'amino-acid',
	'vitamin',
	'buffer',
	'complex',
	'other'
] as const;
export type ComponentCategoryName = (typeof COMPONENT_CATEGORIES)[number];

export const COMPONENT_CATEGORY_LABELS: Record<ComponentCategoryName, string> = {
	salt: 'Salt',
	'trace-metal': 'Trace metal',
	sugar: 'Sugar',
	polyol: 'Polyol',
	'amino-acid': 'Amino acid',
	vitamin: 'Vitamin',
	buffer: 'Buffer',
	complex: 'Complex material',
	other: 'Other'
};
