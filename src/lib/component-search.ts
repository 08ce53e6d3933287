import Fuse from 'fuse.js';

/** What the search reads of a library component. */
export interface SearchableComponent {
	id: string;
	name: string;
	formula: string | null;
	casNumber: string | null;
	synonyms: readonly string[];
}

export type MatchField = 'name' | 'synonym' | 'formula' | 'cas' | 'id';

/** How close the match is, best first: the order of the result list. */
export const MATCH_KINDS = [
	'exact',
	'exact-loose',
	'prefix',
	'words',
	'substring',
	'fuzzy'
] as const;
export type MatchKind = (typeof MATCH_KINDS)[number];

export interface ComponentMatch<T extends SearchableComponent = SearchableComponent> {
	component: T;
	field: MatchField;
	/** The text of the field that matched, as stored: the synonym or CAS number behind a listing. */
	matchedText: string;
	kind: MatchKind;
}

interface IndexedField {
	field: MatchField;
	text: string;
	/** Compared as typed (formulas with their adduct dot unified). */
	strict: string;
	/** Compared with case, punctuation and spacing ignored (CAS numbers: digits only). */
	loose: string;
	words: string[];
}

interface IndexedComponent<T> {
	component: T;
	fields: IndexedField[];
}

export interface ComponentIndex<T extends SearchableComponent = SearchableComponent> {
	entries: IndexedComponent<T>[];
	fuzzy: Fuse<T>;
}

const FIELD_ORDER: MatchField[] = ['name', 'synonym', 'formula', 'cas', 'id'];
const ADDUCT_DOTS = /\s*[·•∙⋅*.]\s*/g;
/** Shorter queries match too much by chance to be worth a fuzzy guess. */
const MIN_FUZZY_QUERY_LENGTH = 3;
/** Short CAS fragments (a "7") are in most numbers; a CAS prefix needs this many digits. */
const MIN_CAS_DIGITS = 3;

function looseName(text: string): string {
	return text
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[\u0300-\u036f]/g, '')
		.replace(/[^\p{L}\p{N}]+/gu, ' ')
		.trim();
}

function strictFormula(text: string): string {
	return text.trim().replace(ADDUCT_DOTS, '·').replace(/\s+/g, '');
}

function casDigits(text: string): string {
	return /^[\d\s-]+$/.test(text.trim()) ? text.replace(/\D/g, '') : '';
}

function nameField(field: 'name' | 'synonym', text: string): IndexedField {
	const loose = looseName(text);
	return { field, text, strict: text.trim(), loose, words: loose.split(' ') };
}

function fieldsOf(c: SearchableComponent): IndexedField[] {
	const fields = [nameField('name', c.name), ...c.synonyms.map((s) => nameField('synonym', s))];
	if (c.formula) {
		const strict = strictFormula(c.formula);
		fields.push({
			field: 'formula',
			text: c.formula,
			strict,
			loose: strict.toLowerCase(),
			words: []
		});
	}
	if (c.casNumber) {
		const text = c.casNumber;
		fields.push({ field: 'cas', text, strict: text.trim(), loose: casDigits(text), words: [] });
	}
	fields.push({ field: 'id', text: c.id, strict: c.id, loose: c.id.toLowerCase(), words: [] });
	return fields;
}

/**
 * Indexes the library once for many searches. Fuzzy matching is fuse.js (Bitap, edit distance
 * anywhere in the text) over names and synonyms only: a formula or CAS number one character off is
 * another substance, not a typo to forgive.
 */
export function indexComponents<T extends SearchableComponent>(
	components: readonly T[]
): ComponentIndex<T> {
	return {
		entries: components.map((component) => ({ component, fields: fieldsOf(component) })),
		fuzzy: new Fuse([...components], {
			keys: [
				{ name: 'name', weight: 2 },
				{ name: 'synonyms', weight: 1 }
			],
			includeScore: true,
			includeMatches: true,
			ignoreLocation: true,
			threshold: 0.35,
			minMatchCharLength: 2
		})
	};
}

interface Query {
	strict: string;
	loose: string;
	words: string[];
	formula: string;
	cas: string;
}

function readQuery(text: string): Query {
	const loose = looseName(text);
	const formula = strictFormula(text);
	return { strict: text.trim(), loose, words: loose.split(' '), formula, cas: casDigits(text) };
}

/** The closest way one field matches the query, or null. */
function kindOf(field: IndexedField, q: Query): MatchKind | null {
	const strictQuery = field.field === 'formula' ? q.formula : q.strict;
	if (field.strict === strictQuery) return 'exact';
	const query =
		field.field === 'formula'
			? q.formula.toLowerCase()
			: field.field === 'cas'
				? q.cas
				: field.field === 'id'
					? q.strict.toLowerCase()
					: q.loose;
	if (!query) return null;
	if (field.loose === query) return 'exact-loose';
	if (field.field === 'id') return null;
	if (field.field === 'cas' && query.length < MIN_CAS_DIGITS) return null;
	if (field.loose.startsWith(query)) return 'prefix';
	if (
		field.words.length &&
		q.words.every((w) => field.words.some((fieldWord) => fieldWord.startsWith(w)))
	)
		return 'words';
	if (field.loose.includes(query)) return 'substring';
	return null;
}

interface Ranked<T extends SearchableComponent> extends ComponentMatch<T> {
	score: number;
}

function rankOf<T extends SearchableComponent>(m: Ranked<T>): number[] {
	return [
		MATCH_KINDS.indexOf(m.kind),
		m.score,
		FIELD_ORDER.indexOf(m.field),
		m.component.name.length
	];
}

function compareRanked<T extends SearchableComponent>(a: Ranked<T>, b: Ranked<T>): number {
	const ra = rankOf(a);
	const rb = rankOf(b);
	for (let i = 0; i < ra.length; i++) if (ra[i] !== rb[i]) return ra[i] - rb[i];
	return a.component.name.localeCompare(b.component.name);
}

function bestFieldMatch<T extends SearchableComponent>(
	entry: IndexedComponent<T>,
	q: Query
): Ranked<T> | null {
	let best: Ranked<T> | null = null;
	for (const field of entry.fields) {
		const kind = kindOf(field, q);
		if (!kind) continue;
		const match: Ranked<T> = {
			component: entry.component,
			field: field.field,
			matchedText: field.text,
			kind,
			score: 0
		};
		if (!best || compareRanked(match, best) < 0) best = match;
	}
	return best;
}

function fuzzyMatches<T extends SearchableComponent>(
	index: ComponentIndex<T>,
	text: string,
	found: Set<T>
): Ranked<T>[] {
	if (text.trim().length < MIN_FUZZY_QUERY_LENGTH) return [];
	return index.fuzzy.search(text.trim()).flatMap((result) => {
		if (found.has(result.item)) return [];
		const byName = result.matches?.find((m) => m.key === 'name');
		const bySynonym = result.matches?.find((m) => m.key === 'synonyms');
		const synonymWins = !byName && bySynonym?.value;
		return {
			component: result.item,
			field: synonymWins ? 'synonym' : 'name',
			matchedText: synonymWins ? bySynonym.value! : result.item.name,
			kind: 'fuzzy' as const,
			score: result.score ?? 1
		};
	});
}

/**
 * Components for what a person typed, best first: exact matches of the name, a synonym, the formula
 * (as written first, so "KCl" is potassium chloride and not "kcl" anything), the CAS number or the
 * id; then the same ignoring case and punctuation; then fields starting with the text; names whose
 * words start with each typed word; fields containing it; last, names and synonyms within a few typos.
 */
export function searchComponents<T extends SearchableComponent>(
	index: ComponentIndex<T>,
	query: string,
	limit = 8
): ComponentMatch<T>[] {
	if (!query.trim() || limit <= 0) return [];
	const q = readQuery(query);
	const ranked = index.entries.flatMap((entry) => bestFieldMatch(entry, q) ?? []);
	const found = new Set(ranked.map((m) => m.component));
	ranked.push(...fuzzyMatches(index, query, found));
	return ranked
		.sort(compareRanked)
		.slice(0, limit)
		.map(({ component, field, matchedText, kind }) => ({ component, field, matchedText, kind }));
}

/** The component a text names outright (its id, or its name ignoring case), if exactly one does. */
export function componentNamedBy<T extends SearchableComponent>(
	index: ComponentIndex<T>,
	text: string
): T | undefined {
	const typed = text.trim().toLowerCase();
	if (!typed) return undefined;
	return index.entries.find(
		({ component }) => component.id === text.trim() || component.name.toLowerCase() === typed
	)?.component;
}
