/**
 * A text cell a spreadsheet would run as a formula: it starts with = + - @, or a tab or carriage
 * return (which some spreadsheets skip before reading a formula). Papaparse's own default pattern,
 * `^[=+\-@\t\r].*$`, misses a formula followed by a line break (`.` stops at it), hence this one.
 * Pass it as papaparse's `escapeFormulae`: it puts an apostrophe before such a text cell and leaves
 * numbers alone, so a negative number stays a number a spreadsheet can sum.
 */
export const FORMULA_START = /^[=+\-@\t\r]/;
