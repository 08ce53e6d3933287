/**
 * Default role of each element when a sufficiency assessment weighs a medium against a biomass
 * composition. Common practice in medium design, not a published table: the split into macro-
 * elements (supplied in g/L amounts, their shortage stops growth in proportion) and trace or
 * incidental elements (needed in micro-amounts, or carried by the cells without being needed) is
 * the usual textbook one (e.g. Stanbury, Whitaker & Hall, Principles of Fermentation Technology,
 * on medium design; citation from memory); which element sits on which side here is our choice.
 *
 * - 'required': C, N, P, S, K, Mg, and the carbon source itself. A short supply sets the limit.
 * - 'trace': Fe, Zn, Cu, Mn, Co, Mo, Ni, Se, B and other elements cells need in traces, and Ca, Na,
 *   Cl, which many cells carry without a requirement of that size. A cell's measured content of
 *   these (often quoted from memory) overstates what growth needs, and media and their water carry
 *   them as impurities that a recipe analysis cannot see: a short supply is a warning naming the
 *   element, never the limit. An element not in this table is treated as trace.
 * - H and O are not assessed by default (cells take them from water and O2); when asked for, they
 *   count as required.
 *
 * A profile may override any element's role (e.g. Ca for a cell line whose medium must carry it).
 */
export type ElementRole = 'required' | 'trace';

export const ELEMENT_ROLES = ['required', 'trace'] as const satisfies readonly ElementRole[];

export const DEFAULT_ELEMENT_ROLES: Readonly<Record<string, ElementRole>> = Object.freeze({
	C: 'required',
	H: 'required',
	O: 'required',
	N: 'required',
	P: 'required',
	S: 'required',
	K: 'required',
	Mg: 'required',
	Fe: 'trace',
	Ca: 'trace',
	Na: 'trace',
	Cl: 'trace',
	Zn: 'trace',
	Cu: 'trace',
	Mn: 'trace',
	Co: 'trace',
	Mo: 'trace',
	Ni: 'trace',
	Se: 'trace',
	B: 'trace',
	I: 'trace',
	Si: 'trace',
	V: 'trace',
	W: 'trace'
});

/** Where the default roles come from, as the API and the report state it. */
export const DEFAULT_ELEMENT_ROLES_BASIS =
	'Common practice in medium design: C, N, P, S, K, Mg and the carbon source are required (a shortfall sets the limit); Fe, Ca, Zn, Cu, Mn, Co, Mo, Na, Cl and other elements are trace or incidental (a shortfall is a warning). A profile may override any element.';

export function defaultElementRole(symbol: string): ElementRole {
	return DEFAULT_ELEMENT_ROLES[symbol] ?? 'trace';
}
