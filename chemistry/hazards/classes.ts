/**
 * GHS hazard statements: the hazard class and category each one stands for, with its label
 * elements (pictogram, signal word).
 *
 * Source: UN GHS (Globally Harmonized System of Classification and Labelling of Chemicals),
 * Rev. 10 (2023): Annex 1 (allocation of label elements per class and category) and Annex 3,
 * section 1 (hazard statement codes and texts). The letter forms H350i, H360F, H360D, H360FD,
 * H360Fd, H360Df, H361f, H361d and H361fd are the EU CLP Regulation's (Annex III) way of writing
 * the route or effect that UN GHS lets a supplier add to H350, H360 and H361. Texts use the
 * British spelling of the existing component data ("oxidiser").
 *
 * A statement that covers two categories (H228, H242, H261, H272, H300, H310, H330) carries the
 * label elements of its more severe category here; the supplier's safety data sheet decides.
 */

export type PictogramId =
	'GHS01' | 'GHS02' | 'GHS03' | 'GHS04' | 'GHS05' | 'GHS06' | 'GHS07' | 'GHS08' | 'GHS09';

export const PICTOGRAM_IDS: readonly PictogramId[] = [
	'GHS01',
	'GHS02',
	'GHS03',
	'GHS04',
	'GHS05',
	'GHS06',
	'GHS07',
	'GHS08',
	'GHS09'
];

export type SignalWord = 'Danger' | 'Warning';
export type HazardGroup = 'physical' | 'health' | 'environmental';

export type HazardClassId =
	| 'explosive'
	| 'flammable-gas'
	| 'aerosol'
	| 'oxidising-gas'
	| 'gas-under-pressure'
	| 'flammable-liquid'
	| 'flammable-solid'
	| 'self-reactive-or-peroxide'
	| 'pyrophoric'
	| 'self-heating'
	| 'water-reactive'
	| 'oxidising-liquid-or-solid'
	| 'corrosive-to-metals'
	| 'acute-toxicity-oral'
	| 'acute-toxicity-dermal'
	| 'acute-toxicity-inhalation'
	| 'skin-corrosion-irritation'
	| 'eye-damage-irritation'
	| 'respiratory-sensitisation'
	| 'skin-sensitisation'
	| 'germ-cell-mutagenicity'
	| 'carcinogenicity'
	| 'reproductive-toxicity'
	| 'stot-single-exposure'
	| 'stot-repeated-exposure'
	| 'aspiration'
	| 'aquatic-acute'
	| 'aquatic-chronic'
	| 'ozone-layer';

export interface HazardClass {
	name: string;
	group: HazardGroup;
	/** The UN GHS chapter that defines it. */
	chapter: string;
}

export const HAZARD_CLASSES: Readonly<Record<HazardClassId, HazardClass>> = Object.freeze({
	explosive: { name: 'Explosives', group: 'physical', chapter: '2.1' },
	'flammable-gas': { name: 'Flammable gases', group: 'physical', chapter: '2.2' },
	aerosol: { name: 'Aerosols', group: 'physical', chapter: '2.3' },
	'oxidising-gas': { name: 'Oxidising gases', group: 'physical', chapter: '2.4' },
	'gas-under-pressure': { name: 'Gases under pressure', group: 'physical', chapter: '2.5' },
	'flammable-liquid': { name: 'Flammable liquids', group: 'physical', chapter: '2.6' },
	'flammable-solid': { name: 'Flammable solids', group: 'physical', chapter: '2.7' },
	'self-reactive-or-peroxide': {
		name: 'Self-reactive substances and organic peroxides',
		group: 'physical',
		chapter: '2.8, 2.15'
	},
	pyrophoric: { name: 'Pyrophoric liquids and solids', group: 'physical', chapter: '2.9, 2.10' },
	'self-heating': { name: 'Self-heating substances', group: 'physical', chapter: '2.11' },
	'water-reactive': {
		name: 'Substances which in contact with water emit flammable gases',
		group: 'physical',
		chapter: '2.12'
	},
	'oxidising-liquid-or-solid': {
		name: 'Oxidising liquids and solids',
		group: 'physical',
		chapter: '2.13, 2.14'
	},
	'corrosive-to-metals': { name: 'Corrosive to metals', group: 'physical', chapter: '2.16' },
	'acute-toxicity-oral': { name: 'Acute toxicity (oral)', group: 'health', chapter: '3.1' },
	'acute-toxicity-dermal': { name: 'Acute toxicity (dermal)', group: 'health', chapter: '3.1' },
	'acute-toxicity-inhalation': {
		name: 'Acute toxicity (inhalation)',
		group: 'health',
		chapter: '3.1'
	},
	'skin-corrosion-irritation': {
		name: 'Skin corrosion/irritation',
		group: 'health',
		chapter: '3.2'
	},
	'eye-damage-irritation': {
		name: 'Serious eye damage/eye irritation',
		group: 'health',
		chapter: '3.3'
	},
	'respiratory-sensitisation': {
		name: 'Respiratory sensitisation',
		group: 'health',
		chapter: '3.4'
	},
	'skin-sensitisation': { name: 'Skin sensitisation', group: 'health', chapter: '3.4' },
	'germ-cell-mutagenicity': { name: 'Germ cell mutagenicity', group: 'health', chapter: '3.5' },
	carcinogenicity: { name: 'Carcinogenicity', group: 'health', chapter: '3.6' },
	'reproductive-toxicity': { name: 'Reproductive toxicity', group: 'health', chapter: '3.7' },
	'stot-single-exposure': {
		name: 'Specific target organ toxicity, single exposure',
		group: 'health',
		chapter: '3.8'
	},
	'stot-repeated-exposure': {
		name: 'Specific target organ toxicity, repeated exposure',
		group: 'health',
		chapter: '3.9'
	},
	aspiration: { name: 'Aspiration hazard', group: 'health', chapter: '3.10' },
	'aquatic-acute': {
		name: 'Hazardous to the aquatic environment, short-term (acute)',
		group: 'environmental',
		chapter: '4.1'
	},
	'aquatic-chronic': {
		name: 'Hazardous to the aquatic environment, long-term (chronic)',
		group: 'environmental',
		chapter: '4.1'
	},
	'ozone-layer': { name: 'Hazardous to the ozone layer', group: 'environmental', chapter: '4.2' }
});

export interface HazardStatementInfo {
	code: string;
	text: string;
	hazardClass: HazardClassId;
	/** As UN GHS names it: '1', '2A', '1A, 1B, 1C', 'Type B' … */
	category: string;
	pictograms: PictogramId[];
	signalWord: SignalWord | null;
	/** A category UN GHS offers as a building block that many jurisdictions leave out. */
	optionalCategory: boolean;
}

type Row = [
	code: string,
	text: string,
	hazardClass: HazardClassId,
	category: string,
	pictograms: PictogramId[],
	signalWord: SignalWord | null,
	optional?: 'optional'
];

// prettier-ignore
const ROWS: Row[] = [
	['H200', 'Unstable explosive', 'explosive', 'Unstable explosive', ['GHS01'], 'Danger'],
	['H201', 'Explosive; mass explosion hazard', 'explosive', 'Division 1.1', ['GHS01'], 'Danger'],
	['H202', 'Explosive; severe projection hazard', 'explosive', 'Division 1.2', ['GHS01'], 'Danger'],
	['H203', 'Explosive; fire, blast or projection hazard', 'explosive', 'Division 1.3', ['GHS01'], 'Danger'],
	['H204', 'Fire or projection hazard', 'explosive', 'Division 1.4', ['GHS01'], 'Warning'],
	['H205', 'May mass explode in fire', 'explosive', 'Division 1.5', [], 'Danger'],
	['H220', 'Extremely flammable gas', 'flammable-gas', '1A', ['GHS02'], 'Danger'],
	['H221', 'Flammable gas', 'flammable-gas', '1B, 2', ['GHS02'], 'Danger'],
	['H222', 'Extremely flammable aerosol', 'aerosol', '1', ['GHS02'], 'Danger'],
	['H223', 'Flammable aerosol', 'aerosol', '2', ['GHS02'], 'Warning'],
	['H224', 'Extremely flammable liquid and vapour', 'flammable-liquid', '1', ['GHS02'], 'Danger'],
	['H225', 'Highly flammable liquid and vapour', 'flammable-liquid', '2', ['GHS02'], 'Danger'],
	['H226', 'Flammable liquid and vapour', 'flammable-liquid', '3', ['GHS02'], 'Warning'],
	['H227', 'Combustible liquid', 'flammable-liquid', '4', [], 'Warning', 'optional'],
	['H228', 'Flammable solid', 'flammable-solid', '1, 2', ['GHS02'], 'Danger'],
	['H240', 'Heating may cause an explosion', 'self-reactive-or-peroxide', 'Type A', ['GHS01'], 'Danger'],
	['H241', 'Heating may cause a fire or explosion', 'self-reactive-or-peroxide', 'Type B', ['GHS01', 'GHS02'], 'Danger'],
	['H242', 'Heating may cause a fire', 'self-reactive-or-peroxide', 'Types C–F', ['GHS02'], 'Danger'],
	['H250', 'Catches fire spontaneously if exposed to air', 'pyrophoric', '1', ['GHS02'], 'Danger'],
	['H251', 'Self-heating; may catch fire', 'self-heating', '1', ['GHS02'], 'Danger'],
	['H252', 'Self-heating in large quantities; may catch fire', 'self-heating', '2', ['GHS02'], 'Warning'],
	['H260', 'In contact with water releases flammable gases which may ignite spontaneously', 'water-reactive', '1', ['GHS02'], 'Danger'],
	['H261', 'In contact with water releases flammable gas', 'water-reactive', '2, 3', ['GHS02'], 'Danger'],
	['H270', 'May cause or intensify fire; oxidiser', 'oxidising-gas', '1', ['GHS03'], 'Danger'],
	['H271', 'May cause fire or explosion; strong oxidiser', 'oxidising-liquid-or-solid', '1', ['GHS03'], 'Danger'],
	['H272', 'May intensify fire; oxidiser', 'oxidising-liquid-or-solid', '2, 3', ['GHS03'], 'Danger'],
	['H280', 'Contains gas under pressure; may explode if heated', 'gas-under-pressure', 'Compressed, liquefied or dissolved gas', ['GHS04'], 'Warning'],
	['H281', 'Contains refrigerated gas; may cause cryogenic burns or injury', 'gas-under-pressure', 'Refrigerated liquefied gas', ['GHS04'], 'Warning'],
	['H290', 'May be corrosive to metals', 'corrosive-to-metals', '1', ['GHS05'], 'Warning'],
	['H300', 'Fatal if swallowed', 'acute-toxicity-oral', '1, 2', ['GHS06'], 'Danger'],
	['H301', 'Toxic if swallowed', 'acute-toxicity-oral', '3', ['GHS06'], 'Danger'],
	['H302', 'Harmful if swallowed', 'acute-toxicity-oral', '4', ['GHS07'], 'Warning'],
	['H303', 'May be harmful if swallowed', 'acute-toxicity-oral', '5', [], 'Warning', 'optional'],
	['H304', 'May be fatal if swallowed and enters airways', 'aspiration', '1', ['GHS08'], 'Danger'],
	['H305', 'May be harmful if swallowed and enters airways', 'aspiration', '2', ['GHS08'], 'Warning', 'optional'],
	['H310', 'Fatal in contact with skin', 'acute-toxicity-dermal', '1, 2', ['GHS06'], 'Danger'],
	['H311', 'Toxic in contact with skin', 'acute-toxicity-dermal', '3', ['GHS06'], 'Danger'],
	['H312', 'Harmful in contact with skin', 'acute-toxicity-dermal', '4', ['GHS07'], 'Warning'],
	['H313', 'May be harmful in contact with skin', 'acute-toxicity-dermal', '5', [], 'Warning', 'optional'],
	['H314', 'Causes severe skin burns and eye damage', 'skin-corrosion-irritation', '1 (1A, 1B, 1C)', ['GHS05'], 'Danger'],
	['H315', 'Causes skin irritation', 'skin-corrosion-irritation', '2', ['GHS07'], 'Warning'],
	['H316', 'Causes mild skin irritation', 'skin-corrosion-irritation', '3', [], 'Warning', 'optional'],
	['H317', 'May cause an allergic skin reaction', 'skin-sensitisation', '1 (1A, 1B)', ['GHS07'], 'Warning'],
	['H318', 'Causes serious eye damage', 'eye-damage-irritation', '1', ['GHS05'], 'Danger'],
	['H319', 'Causes serious eye irritation', 'eye-damage-irritation', '2A', ['GHS07'], 'Warning'],
	['H320', 'Causes eye irritation', 'eye-damage-irritation', '2B', [], 'Warning', 'optional'],
	['H330', 'Fatal if inhaled', 'acute-toxicity-inhalation', '1, 2', ['GHS06'], 'Danger'],
	['H331', 'Toxic if inhaled', 'acute-toxicity-inhalation', '3', ['GHS06'], 'Danger'],
	['H332', 'Harmful if inhaled', 'acute-toxicity-inhalation', '4', ['GHS07'], 'Warning'],
	['H333', 'May be harmful if inhaled', 'acute-toxicity-inhalation', '5', [], 'Warning', 'optional'],
	['H334', 'May cause allergy or asthma symptoms or breathing difficulties if inhaled', 'respiratory-sensitisation', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H335', 'May cause respiratory irritation', 'stot-single-exposure', '3', ['GHS07'], 'Warning'],
	['H336', 'May cause drowsiness or dizziness', 'stot-single-exposure', '3', ['GHS07'], 'Warning'],
	['H340', 'May cause genetic defects', 'germ-cell-mutagenicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H341', 'Suspected of causing genetic defects', 'germ-cell-mutagenicity', '2', ['GHS08'], 'Warning'],
	['H350', 'May cause cancer', 'carcinogenicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H350i', 'May cause cancer by inhalation', 'carcinogenicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H351', 'Suspected of causing cancer', 'carcinogenicity', '2', ['GHS08'], 'Warning'],
	['H360', 'May damage fertility or the unborn child', 'reproductive-toxicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H360F', 'May damage fertility', 'reproductive-toxicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H360D', 'May damage the unborn child', 'reproductive-toxicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H360FD', 'May damage fertility. May damage the unborn child', 'reproductive-toxicity', '1 (1A, 1B)', ['GHS08'], 'Danger'],
	['H360Fd', 'May damage fertility. Suspected of damaging the unborn child', 'reproductive-toxicity', '1 (fertility), 2 (development)', ['GHS08'], 'Danger'],
	['H360Df', 'May damage the unborn child. Suspected of damaging fertility', 'reproductive-toxicity', '1 (development), 2 (fertility)', ['GHS08'], 'Danger'],
	['H361', 'Suspected of damaging fertility or the unborn child', 'reproductive-toxicity', '2', ['GHS08'], 'Warning'],
	['H361f', 'Suspected of damaging fertility', 'reproductive-toxicity', '2', ['GHS08'], 'Warning'],
	['H361d', 'Suspected of damaging the unborn child', 'reproductive-toxicity', '2', ['GHS08'], 'Warning'],
	['H361fd', 'Suspected of damaging fertility. Suspected of damaging the unborn child', 'reproductive-toxicity', '2', ['GHS08'], 'Warning'],
	['H362', 'May cause harm to breast-fed children', 'reproductive-toxicity', 'Effects on or via lactation', [], null],
	['H370', 'Causes damage to organs', 'stot-single-exposure', '1', ['GHS08'], 'Danger'],
	['H371', 'May cause damage to organs', 'stot-single-exposure', '2', ['GHS08'], 'Warning'],
	['H372', 'Causes damage to organs through prolonged or repeated exposure', 'stot-repeated-exposure', '1', ['GHS08'], 'Danger'],
	['H373', 'May cause damage to organs through prolonged or repeated exposure', 'stot-repeated-exposure', '2', ['GHS08'], 'Warning'],
	['H400', 'Very toxic to aquatic life', 'aquatic-acute', 'Acute 1', ['GHS09'], 'Warning'],
	['H401', 'Toxic to aquatic life', 'aquatic-acute', 'Acute 2', [], null, 'optional'],
	['H402', 'Harmful to aquatic life', 'aquatic-acute', 'Acute 3', [], null, 'optional'],
	['H410', 'Very toxic to aquatic life with long lasting effects', 'aquatic-chronic', 'Chronic 1', ['GHS09'], 'Warning'],
	['H411', 'Toxic to aquatic life with long lasting effects', 'aquatic-chronic', 'Chronic 2', ['GHS09'], null],
	['H412', 'Harmful to aquatic life with long lasting effects', 'aquatic-chronic', 'Chronic 3', [], null],
	['H413', 'May cause long lasting harmful effects to aquatic life', 'aquatic-chronic', 'Chronic 4', [], null],
	['H420', 'Harms public health and the environment by destroying ozone in the upper atmosphere', 'ozone-layer', '1', ['GHS07'], 'Warning']
];

export const HAZARD_STATEMENTS: Readonly<Record<string, HazardStatementInfo>> = Object.freeze(
	Object.fromEntries(
		ROWS.map(([code, text, hazardClass, category, pictograms, signalWord, optional]) => [
			code,
			{
				code,
				text,
				hazardClass,
				category,
				pictograms,
				signalWord,
				optionalCategory: optional === 'optional'
			}
		])
	)
);

/** 'h319 ' → 'H319'; the letters after the number keep their case (H360Fd ≠ H360FD). */
export function normaliseHazardCode(code: string): string {
	const trimmed = code.trim();
	return trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
}

/** A combined statement (H300+H310+H330) stands for each of its parts. */
export function splitHazardCode(code: string): string[] {
	const parts = normaliseHazardCode(code)
		.split('+')
		.map((part) => normaliseHazardCode(part))
		.filter((part) => part.length > 0);
	return parts.map((part, i) => (i > 0 && /^\d/.test(part) ? `H${part}` : part));
}

export function hazardStatementInfo(code: string): HazardStatementInfo | undefined {
	return HAZARD_STATEMENTS[normaliseHazardCode(code)];
}

export interface LabelElements {
	pictograms: PictogramId[];
	signalWord: SignalWord | null;
}

/**
 * The pictograms and signal word a label carries for a set of statements, with the GHS
 * precedence rules (UN GHS Rev. 10, 1.4.10.5.3.1 and 1.4.10.5.3.2): no exclamation mark beside the
 * skull and crossbones; none for skin or eye irritation beside the corrosion symbol; none for skin
 * sensitisation or skin or eye irritation beside the health hazard symbol used for respiratory
 * sensitisation; "Warning" is not shown when "Danger" applies.
 */
export function labelElementsOf(codes: readonly string[]): LabelElements {
	const infos = codes.flatMap(splitHazardCode).flatMap((code) => {
		const info = hazardStatementInfo(code);
		return info ? [info] : [];
	});
	const has = (id: PictogramId) => infos.some((info) => info.pictograms.includes(id));
	const exclamationOnlyFor = (allowed: readonly string[]) =>
		infos.every((info) => !info.pictograms.includes('GHS07') || allowed.includes(info.code));
	const pictograms = PICTOGRAM_IDS.filter((id) => {
		if (id !== 'GHS07' || !has('GHS07')) return has(id);
		if (has('GHS06')) return false;
		if (has('GHS05') && exclamationOnlyFor(['H315', 'H319'])) return false;
		if (infos.some((i) => i.code === 'H334') && exclamationOnlyFor(['H315', 'H317', 'H319']))
			return false;
		return true;
	});
	const words = infos.map((info) => info.signalWord);
	const signalWord = words.includes('Danger')
		? 'Danger'
		: words.includes('Warning')
			? 'Warning'
			: null;
	return { pictograms, signalWord };
}
