import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { classifySolution, HAZARD_STATEMENTS, type SolutionClassification } from '../../chemistry';

const hazards = (codes: readonly string[]) => codes.map((code) => ({ code, text: code }));

// A label as a supplier would write it: at most one category per class (and route); a skin
// corrosive is eye category 1 by definition (UN GHS 3.3.2), written as H314 alone (1.4.10.5.3.3),
// and H400 is left out beside H410 (likewise H401/H411, H402/H412).
const labelArbitrary = fc
	.record({
		oral: fc.constantFrom(null, 'H300', 'H301', 'H302', 'H303'),
		dermal: fc.constantFrom(null, 'H310', 'H311', 'H312', 'H313'),
		inhalation: fc.constantFrom(null, 'H330', 'H331', 'H332', 'H333'),
		skin: fc.constantFrom(null, 'H314', 'H315', 'H316'),
		eye: fc.constantFrom(null, 'H318', 'H319', 'H320'),
		sensitisers: fc.subarray(['H317', 'H334']),
		mutagen: fc.constantFrom(null, 'H340', 'H341'),
		carcinogen: fc.constantFrom(null, 'H350', 'H350i', 'H351'),
		reproductive: fc.constantFrom(
			null,
			...['H360', 'H360F', 'H360D', 'H360FD', 'H360Fd', 'H360Df'],
			...['H361', 'H361f', 'H361d', 'H361fd']
		),
		stot: fc.subarray(['H335', 'H336', 'H362', 'H370', 'H371', 'H372', 'H373']),
		aspiration: fc.constantFrom(null, 'H304', 'H305'),
		aquaticAcute: fc.constantFrom(null, 'H400', 'H401', 'H402'),
		aquaticChronic: fc.constantFrom(null, 'H410', 'H411', 'H412', 'H413'),
		physical: fc.subarray(['H225', 'H228', 'H272', 'H290'])
	})
	.map((label) => {
		const codes = Object.values(label)
			.flat()
			.filter((c): c is string => c !== null);
		return codes.filter(
			(code) =>
				!(['H318', 'H319', 'H320'].includes(code) && codes.includes('H314')) &&
				!(code === 'H400' && codes.includes('H410')) &&
				!(code === 'H401' && codes.includes('H411')) &&
				!(code === 'H402' && codes.includes('H412'))
		);
	});

const codesOf = (result: SolutionClassification) => result.hazards.map((x) => x.code).sort();

describe('a pure ingredient (massFraction 1)', () => {
	it('returns its own statements', () => {
		fc.assert(
			fc.property(labelArbitrary, (codes) => {
				const result = classifySolution([
					{ name: 'Pure', massFraction: 1, hazards: hazards(codes) }
				]);
				expect(codesOf(result)).toEqual([...codes].sort());
			}),
			{ numRuns: 500 }
		);
	});
});

// Severity, written here apart from the library: within a ladder the first is the most severe.
// A statement the label omits by precedence is covered by the one that omits it.
const LADDERS = [
	['H300', 'H301', 'H302', 'H303'],
	['H310', 'H311', 'H312', 'H313'],
	['H330', 'H331', 'H332'],
	['H314', 'H315', 'H316'],
	['H318', 'H319', 'H320'],
	['H370', 'H371'],
	['H372', 'H373'],
	['H304', 'H305'],
	['H400', 'H401', 'H402'],
	['H410', 'H411', 'H412', 'H413']
];
const IMPLIES: Record<string, string> = { H314: 'H318', H410: 'H400', H411: 'H401', H412: 'H402' };

// Reproductive statements as [fertility, development, unspecified] categories (0 = none).
function reproductiveEffects(code: string): [number, number, number] | null {
	const match = /^H36([01])(F?)(D?)(f?)(d?)$/.exec(code);
	if (!match) return null;
	const base = match[1] === '0' ? 1 : 2;
	const [, , F, D, f, d] = match;
	const fertility = F ? base : f ? 2 : 0;
	const development = D ? base : d ? 2 : 0;
	return [fertility, development, !F && !D && !f && !d ? base : 0];
}

function covered(code: string, high: ReadonlySet<string>): boolean {
	if (high.has(code)) return true;
	const present = new Set([...high, ...[...high].flatMap((c) => IMPLIES[c] ?? [])]);
	const ladder = LADDERS.find((l) => l.includes(code));
	if (ladder) return ladder.slice(0, ladder.indexOf(code) + 1).some((c) => present.has(c));
	const effects = reproductiveEffects(code);
	if (!effects) return false;
	const highEffects = [...high].map(reproductiveEffects).filter((e) => e !== null);
	return effects.every(
		(category, i) => category === 0 || highEffects.some((e) => e[i] !== 0 && e[i] <= category)
	);
}

const KNOWN_CODES = Object.keys(HAZARD_STATEMENTS);

// Concentrations at and around the standard's limits (0.1, 0.3, 1, 3, 5, 10, 20, 25 %), and any.
const fractionArbitrary = fc.oneof(
	fc.constantFrom(0, 0.0009, 0.001, 0.0025, 0.003, 0.005, 0.0099, 0.01, 0.02, 0.025),
	fc.constantFrom(0.029, 0.03, 0.045, 0.05, 0.09, 0.1, 0.15, 0.2, 0.25, 0.3),
	fc.double({ min: 0, max: 0.3, noNaN: true })
);

describe('classification is monotone in concentration', () => {
	it('never removes a hazard when there is more of an ingredient', () => {
		const ingredient = fc.record({
			massFraction: fractionArbitrary,
			codes: fc.subarray(KNOWN_CODES, { minLength: 1, maxLength: 5 })
		});
		fc.assert(
			fc.property(
				fc.array(ingredient, { minLength: 1, maxLength: 3 }),
				fc.nat(),
				fractionArbitrary,
				(ingredients, pick, other) => {
					const index = pick % ingredients.length;
					const others = ingredients.reduce((s, x, i) => (i === index ? s : s + x.massFraction), 0);
					const low = Math.min(ingredients[index].massFraction, other);
					const high = Math.min(Math.max(ingredients[index].massFraction, other), 1 - others);
					fc.pre(high >= low);
					const solution = (x: number) =>
						classifySolution(
							ingredients.map((ing, i) => ({
								name: `I${i}`,
								massFraction: i === index ? x : ing.massFraction,
								hazards: hazards(ing.codes)
							}))
						);
					const before = solution(low);
					const after = solution(high);
					const afterCodes = new Set(after.hazards.map((x) => x.code));
					for (const hazard of before.hazards) {
						expect([hazard.code, covered(hazard.code, afterCodes)]).toEqual([hazard.code, true]);
					}
					for (const notice of before.notices) {
						const kept =
							afterCodes.has(notice.code) || after.notices.some((n) => n.code === notice.code);
						expect([notice.code, kept]).toEqual([notice.code, true]);
					}
				}
			),
			{ numRuns: 2000 }
		);
	});
});
