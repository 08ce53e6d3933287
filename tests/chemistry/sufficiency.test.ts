import { describe, expect, it } from 'vitest';
import { BIOMASS_COMPOSITIONS, findBiomassComposition } from '../../chemistry/data/biomass';
import {
	DEFAULT_SAFETY_FACTOR,
	assessSufficiency,
	type SufficiencyInput
} from '../../chemistry/sufficiency';
import { errorOf } from './input-error';

// Bacterial dry-mass fractions, Neidhardt, Ingraham & Schaechter (1990): N 14 %, P 3 %, S 1 %
// (confirmed, chemistry/REFERENCES.md); Mg 0.5 % (from memory); C 50 % (from memory).
const bacterial = { C: 0.5, N: 0.14, P: 0.03, S: 0.01, Mg: 0.005 };

// A basal medium (1.0 L) plus one feed (0.25 L); final volume 1.25 L.
const mediumAndFeed: SufficiencyInput['supply'] = {
	finalVolumeL: 1.25,
	sources: [
		{
			name: 'basal medium',
			volumeL: 1.0,
			elementsGPerL: { N: 4.0, P: 1.5, S: 0.5, Mg: 0.35 },
			componentsGPerL: { glucose: 20 }
		},
		{
			name: 'feed',
			volumeL: 0.25,
			elementsGPerL: { N: 20, P: 2.0 },
			componentsGPerL: { glucose: 500 }
		}
	]
};

describe('nutrient sufficiency', () => {
	it('finds the limiting element and the maximum biomass worked out by hand', () => {
		const r = assessSufficiency({
			profile: { kind: 'elementalFractions', fractions: bacterial },
			target: { biomassGPerL: 40 },
			supply: mediumAndFeed,
			carbon: { basis: 'component', component: 'glucose', yieldGPerG: 0.5 }
		});
		// Demand at 40 g/L: N 40 × 0.14 = 5.6; P 40 × 0.03 = 1.2; S 40 × 0.01 = 0.4; Mg 40 × 0.005 = 0.2 g/L.
		// Supply per litre of final volume (1.25 L):
		//   N  = (4.0 × 1.0 + 20 × 0.25) / 1.25 = 9.0 / 1.25 = 7.2 g/L   → ratio 7.2 / 5.6 = 1.2857
		//   P  = (1.5 × 1.0 + 2.0 × 0.25) / 1.25 = 2.0 / 1.25 = 1.6 g/L  → ratio 1.6 / 1.2 = 1.3333
		//   S  = 0.5 / 1.25 = 0.4 g/L                                     → ratio 0.4 / 0.4 = 1.0
		//   Mg = 0.35 / 1.25 = 0.28 g/L                                   → ratio 0.28 / 0.2 = 1.4
		// Carbon with Yx/s = 0.5 g/g: glucose demand 40 / 0.5 = 80 g/L, supply (20 + 500 × 0.25)/1.25 = 116 g/L
		//   → ratio 1.45.
		// Limiting: S (ratio 1.0); maximum biomass = 40 × 1.0 / 1.2 = 33.33 g/L.
		const line = (key: string) => r.lines.find((l) => l.key === key);
		expect(r.safetyFactor).toBe(1.2);
		expect(line('N')?.demandGPerL).toBeCloseTo(5.6, 12);
		expect(line('N')?.supplyGPerL).toBeCloseTo(7.2, 12);
		expect(line('N')?.ratio).toBeCloseTo(1.285714, 6);
		expect(line('P')?.ratio).toBeCloseTo(1.333333, 6);
		expect(line('Mg')?.ratio).toBeCloseTo(1.4, 12);
		expect(line('glucose')?.demandGPerL).toBeCloseTo(80, 12);
		expect(line('glucose')?.ratio).toBeCloseTo(1.45, 12);
		expect(line('C')).toBeUndefined();
		expect(r.limiting).toEqual({ key: 'S', basis: 'element', ratio: expect.closeTo(1, 12) });
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo(33.3333, 4);
		expect(r.sufficient).toBe(false);
		expect(line('S')?.sufficient).toBe(false);
		expect(line('N')?.sufficient).toBe(true);
		// margin = supply − 1.2 × demand: S 0.4 − 0.48 = −0.08 g/L
		expect(line('S')?.marginGPerL).toBeCloseTo(-0.08, 12);
		// mmol/L via IUPAC 2021 S = 32.06: 0.4 g/L = 12.477 mmol/L
		expect(line('S')?.supplyMmolPerL).toBeCloseTo(12.477, 3);
	});

	it('counts only biomass carbon without a yield, and says so', () => {
		const r = assessSufficiency({
			profile: { kind: 'elementalFractions', fractions: bacterial },
			target: { biomassGPerL: 10 },
			supply: { sources: [{ elementsGPerL: { C: 8, N: 2, P: 0.5, S: 0.2, Mg: 0.1 } }] }
		});
		const c = r.lines.find((l) => l.key === 'C');
		// 10 g/L × 0.5 = 5 g C/L; 8 / 5 = 1.6
		expect(c?.demandGPerL).toBeCloseTo(5, 12);
		expect(c?.ratio).toBeCloseTo(1.6, 12);
		expect(c?.note).toContain('respired carbon is not included');
		// With Yx/C = 1.0 g biomass per g C the carbon demand doubles to X / Y = 10 g C/L: now short.
		const withYield = assessSufficiency({
			profile: { kind: 'elementalFractions', fractions: bacterial },
			target: { biomassGPerL: 10 },
			supply: { sources: [{ elementsGPerL: { C: 8, N: 2, P: 0.5, S: 0.2, Mg: 0.1 } }] },
			carbon: { basis: 'element', yieldGPerGCarbon: 1.0 }
		});
		expect(withYield.lines.find((l) => l.key === 'C')?.demandGPerL).toBeCloseTo(10, 12);
		expect(withYield.limiting?.key).toBe('C');
		// H and O come from water and O2: not assessed.
		expect(r.lines.some((l) => l.key === 'H' || l.key === 'O')).toBe(false);
	});

	it('refuses a carbon yield that would put more carbon in cells than they take up', () => {
		// f_C = 0.5 → at most 1 / 0.5 = 2 g biomass per g C.
		const e = errorOf(() =>
			assessSufficiency({
				profile: { kind: 'elementalFractions', fractions: bacterial },
				target: { biomassGPerL: 10 },
				supply: { sources: [{ elementsGPerL: { C: 8 } }] },
				carbon: { basis: 'element', yieldGPerGCarbon: 2.5 }
			})
		);
		expect(e.field).toBe('carbon.yieldGPerGCarbon');
	});

	it('assesses per-cell consumption for cell culture, worked by hand', () => {
		// Target 1e7 cells/mL = 1e10 cells/L. Glutamine 0.8 mmol per 1e9 cells → 10 × 0.8 = 8 mmol/L
		// = 8 × 146.146 / 1000 = 1.16917 g/L (C5H10N2O3, IUPAC 2021). Supply 4 mM = 0.584584 g/L → ratio 0.5.
		// Glucose 500 pg/cell → 1e10 × 500e-12 g = 5 g/L; supply 7 g/L → ratio 1.4.
		// Limiting glutamine: max cells = 1e7 × 0.5 / 1.2 = 4.1667e6 cells/mL; with 300 pg dry mass per cell
		// the target is 1e10 × 300e-12 = 3 g/L dry biomass.
		const r = assessSufficiency({
			profile: {
				kind: 'perCell',
				cellDryMassPg: 300,
				consumption: [
					{ key: 'glutamine', basis: 'component', mmolPer1e9Cells: 0.8, formula: 'C5H10N2O3' },
					{ key: 'glucose', basis: 'component', pgPerCell: 500 }
				]
			},
			target: { cellsPerMl: 1e7 },
			supply: { sources: [{ componentsGPerL: { glutamine: 4 * 0.146146, glucose: 7 } }] }
		});
		const gln = r.lines.find((l) => l.key === 'glutamine');
		expect(gln?.demandMmolPerL).toBeCloseTo(8, 10);
		expect(gln?.demandGPerL).toBeCloseTo(1.16917, 5);
		expect(gln?.ratio).toBeCloseTo(0.5, 10);
		expect(r.lines.find((l) => l.key === 'glucose')?.demandGPerL).toBeCloseTo(5, 10);
		expect(r.limiting?.key).toBe('glutamine');
		expect(r.maximumSupportable.cellsPerMl).toBeCloseTo((1e7 * 0.5) / 1.2, -1);
		expect(r.target.biomassGPerL).toBeCloseTo(3, 12);
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo((3 * 0.5) / 1.2, 10);
	});

	it('adds total grams over a final volume, and component requirements per g biomass', () => {
		// 12 g of KH2PO4-like component in 2 L = 6 g/L; requirement 0.1 g/g × 20 g/L = 2 g/L → ratio 3;
		// max biomass with safety 1.5 = 20 × 3 / 1.5 = 40 g/L.
		const r = assessSufficiency({
			profile: { kind: 'componentRequirements', requirementsGPerG: { phosphate: 0.1 } },
			target: { biomassGPerL: 20 },
			supply: { finalVolumeL: 2, sources: [{ componentsG: { phosphate: 12 } }] },
			safetyFactor: 1.5
		});
		expect(r.lines[0].supplyGPerL).toBeCloseTo(6, 12);
		expect(r.lines[0].ratio).toBeCloseTo(3, 12);
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo(40, 12);
		expect(r.sufficient).toBe(true);
	});

	it('warns of a trace element no source supplies, and takes the limit from the required ones', () => {
		// This test used to expect Fe as the limit with 0 g/L supportable. Fe is a trace element by default
		// (chemistry/data/element-roles.ts, common practice): its absence is now a warning, not the limit.
		const r = assessSufficiency({
			profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
			target: { biomassGPerL: 5 },
			supply: {
				sources: [
					{ elementsGPerL: { C: 10, N: 2, P: 1, S: 0.5, K: 1, Na: 1, Ca: 0.1, Mg: 0.1, Cl: 1 } }
				]
			}
		});
		// Neidhardt, Ingraham & Schaechter (1990) fractions at 5 g/L: N 0.14 × 5 = 0.7 g/L → ratio 2 / 0.7 = 2.857;
		// C 2.5 (ratio 4), P 0.15 (6.67), S 0.05 (10), K 0.05 (20), Mg 0.025 (4). N limits:
		// 5 × 2.857 / 1.2 (safety factor, common practice) = 11.905 g/L.
		expect(r.limiting?.key).toBe('N');
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo((5 * (2 / 0.7)) / 1.2, 9);
		expect(r.sufficient).toBe(true);
		const fe = r.lines.find((l) => l.key === 'Fe')!;
		expect(fe.note).toContain('Not supplied');
		expect(fe).toMatchObject({
			role: 'trace',
			roleFrom: 'default',
			confidence: 'from memory',
			sufficient: false,
			ratio: 0
		});
		// Fe 0.2 % of dry mass (Neidhardt et al. 1990, from memory in our table).
		expect(r.warnings).toEqual([
			expect.stringMatching(
				/^Fe is in no source \(the profile counts it at 0\.2 % of dry mass, from memory\): a trace element does not set the limit/
			)
		]);
	});

	it('lets a profile mark an element required or trace, and say how sure its value is', () => {
		const supply = {
			sources: [{ elementsGPerL: { C: 10, N: 2, P: 1, S: 0.5, K: 1, Mg: 0.1, Fe: 0.004 } }]
		};
		// Fe required by the profile's own statement: 0.004 g/L against 5 × 0.002 = 0.01 g/L → ratio 0.4,
		// 5 × 0.4 / 1.2 = 1.667 g/L, now the limit.
		const feRequired = assessSufficiency({
			profile: {
				kind: 'preset',
				id: 'bacterium-neidhardt-1990',
				elements: {
					Fe: { role: 'required', confidence: 'measured', source: 'our ICP-OES, lot 12' }
				}
			},
			target: { biomassGPerL: 5 },
			supply
		});
		expect(feRequired.limiting).toEqual({
			key: 'Fe',
			basis: 'element',
			ratio: expect.closeTo(0.4, 12)
		});
		expect(feRequired.maximumSupportable.biomassGPerL).toBeCloseTo((5 * 0.4) / 1.2, 12);
		expect(feRequired.lines.find((l) => l.key === 'Fe')).toMatchObject({
			role: 'required',
			roleFrom: 'profile',
			confidence: 'measured',
			source: 'our ICP-OES, lot 12'
		});
		// A statement with a confidence only keeps the default role.
		const n = assessSufficiency({
			profile: {
				kind: 'elementalFractions',
				fractions: bacterial,
				elements: { N: { confidence: 'measured' } }
			},
			target: { biomassGPerL: 5 },
			supply
		}).lines.find((l) => l.key === 'N');
		expect(n).toMatchObject({
			role: 'required',
			roleFrom: 'default',
			confidence: 'measured',
			source: null
		});
		// Mg marked trace and left out of the supply: a warning naming it, not the limit.
		const mgTrace = assessSufficiency({
			profile: {
				kind: 'elementalFractions',
				fractions: bacterial,
				elements: { Mg: { role: 'trace' } }
			},
			target: { biomassGPerL: 5 },
			supply: { sources: [{ elementsGPerL: { C: 10, N: 2, P: 1, S: 0.5 } }] }
		});
		expect(mgTrace.limiting?.key).not.toBe('Mg');
		expect(mgTrace.sufficient).toBe(true);
		expect(mgTrace.warnings.join(' ')).toMatch(/^Mg is in no source/);
	});

	it('refuses statements it cannot use, naming the field', () => {
		const base = {
			target: { biomassGPerL: 5 },
			supply: { sources: [{ elementsGPerL: { N: 1 } }] }
		};
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					profile: {
						kind: 'elementalFractions',
						fractions: bacterial,
						elements: { Zn: { role: 'trace' } }
					}
				})
			).field
		).toBe('profile.elements.Zn');
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					profile: { kind: 'elementalFractions', fractions: bacterial, elements: { Xq: {} } }
				})
			).field
		).toBe('profile.elements.Xq');
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					profile: {
						kind: 'elementalFractions',
						fractions: bacterial,
						elements: { N: { role: 'essential' as never } }
					}
				})
			).field
		).toBe('profile.elements.N.role');
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					profile: {
						kind: 'preset',
						id: 'bacterium-neidhardt-1990',
						elements: { Fe: { confidence: 'sure' as never } }
					}
				})
			).field
		).toBe('profile.elements.Fe.confidence');
		// Nothing left that could set a limit.
		const allTrace = errorOf(() =>
			assessSufficiency({
				...base,
				profile: { kind: 'elementalFractions', fractions: { Fe: 0.002, Zn: 0.0001 } }
			})
		);
		expect(allTrace.field).toBe('profile');
		expect(allTrace.message).toMatch(/trace element/);
	});

	it('gives every line of a per-cell profile a role: components required, elements by the table', () => {
		const r = assessSufficiency({
			profile: {
				kind: 'perCell',
				cellDryMassPg: 300,
				consumption: [
					{ key: 'glutamine', basis: 'component', mmolPer1e9Cells: 0.8, formula: 'C5H10N2O3' },
					{ key: 'Ca', basis: 'element', pgPerCell: 1 }
				],
				elements: { Ca: { role: 'required', confidence: 'from memory' } }
			},
			target: { cellsPerMl: 1e7 },
			supply: { sources: [{ componentsGPerL: { glutamine: 2 }, elementsGPerL: { Ca: 0.001 } }] }
		});
		expect(r.lines.find((l) => l.key === 'glutamine')).toMatchObject({
			role: 'required',
			roleFrom: 'default',
			confidence: 'unstated'
		});
		// Ca: 1e10 cells/L × 1 pg = 0.01 g/L demand against 0.001 → ratio 0.1: required by the profile, so it limits.
		expect(r.lines.find((l) => l.key === 'Ca')).toMatchObject({
			role: 'required',
			roleFrom: 'profile',
			confidence: 'from memory'
		});
		expect(r.limiting?.key).toBe('Ca');
		expect(r.defaultRolesBasis).toMatch(/common practice/i);
	});

	it('defaults the safety factor to 1.2 (common practice) and refuses one below 1', () => {
		expect(DEFAULT_SAFETY_FACTOR).toBe(1.2);
		const e = errorOf(() =>
			assessSufficiency({
				profile: { kind: 'elementalFractions', fractions: bacterial },
				target: { biomassGPerL: 5 },
				supply: mediumAndFeed,
				safetyFactor: 0.8
			})
		);
		expect(e.field).toBe('safetyFactor');
	});

	it('names the field of bad input', () => {
		const base = {
			profile: { kind: 'elementalFractions' as const, fractions: bacterial },
			target: { biomassGPerL: 5 }
		};
		expect(
			errorOf(() => assessSufficiency({ ...base, supply: { sources: [{ elementsG: { N: 1 } }] } }))
				.field
		).toBe('supply.finalVolumeL');
		expect(
			errorOf(() =>
				assessSufficiency({ ...base, supply: { sources: [{ elementsGPerL: { Xq: 1 } }] } })
			).field
		).toBe('supply.sources.0.elementsGPerL.Xq');
		expect(
			errorOf(() =>
				assessSufficiency({ ...base, supply: { sources: [{ elementsGPerL: { N: -1 } }] } })
			).field
		).toBe('supply.sources.0.elementsGPerL.N');
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					profile: { kind: 'preset', id: 'nope' },
					supply: mediumAndFeed
				})
			).field
		).toBe('profile.id');
		expect(
			errorOf(() =>
				assessSufficiency({
					profile: { kind: 'elementalFractions', fractions: bacterial },
					target: { cellsPerMl: 1e6 },
					supply: mediumAndFeed
				})
			).field
		).toBe('target.cellDryMassPg');
	});
});

describe('yields on further substrates', () => {
	it('adds X / Yx/s for each substrate, worked by hand', () => {
		// Glutamine in the feed only: 0.25 L × 40 g/L over 1.25 L = 8 g/L; demand 40 / 4 = 10 g/L → ratio 0.8.
		const supply: SufficiencyInput['supply'] = {
			finalVolumeL: 1.25,
			sources: [
				...mediumAndFeed.sources.slice(0, 1),
				{ ...mediumAndFeed.sources[1], componentsGPerL: { glucose: 500, glutamine: 40 } }
			]
		};
		const r = assessSufficiency({
			profile: { kind: 'elementalFractions', fractions: bacterial },
			target: { biomassGPerL: 40 },
			supply,
			carbon: { basis: 'component', component: 'glucose', yieldGPerG: 0.5 },
			substrates: [{ component: 'glutamine', yieldGPerG: 4, note: 'entered' }]
		});
		const gln = r.lines.find((l) => l.key === 'glutamine')!;
		expect(gln.demandGPerL).toBeCloseTo(10, 9);
		expect(gln.supplyGPerL).toBeCloseTo(8, 9);
		expect(gln.ratio).toBeCloseTo(0.8, 9);
		expect(gln.note).toBe('entered');
		// 40 × 0.8 / 1.2 = 26.7 g/L: below every element line, so glutamine limits.
		expect(r.limiting?.key).toBe('glutamine');
		expect(r.maximumSupportable.biomassGPerL).toBeCloseTo((40 * 0.8) / 1.2, 9);
	});

	it('replaces a component requirement of the same component and refuses duplicates', () => {
		const base = {
			profile: {
				kind: 'componentRequirements' as const,
				requirementsGPerG: { glutamine: 0.05, glucose: 1 }
			},
			target: { biomassGPerL: 10 },
			supply: { finalVolumeL: 1, sources: [{ componentsGPerL: { glutamine: 5, glucose: 50 } }] }
		};
		const r = assessSufficiency({
			...base,
			substrates: [{ component: 'glutamine', yieldGPerG: 2 }]
		});
		const lines = r.lines.filter((l) => l.key === 'glutamine');
		expect(lines).toHaveLength(1);
		expect(lines[0].demandGPerL).toBeCloseTo(5, 9);
		expect(
			errorOf(() =>
				assessSufficiency({
					...base,
					substrates: [
						{ component: 'glutamine', yieldGPerG: 2 },
						{ component: 'glutamine', yieldGPerG: 3 }
					]
				})
			).field
		).toBe('substrates.1.component');
		expect(
			errorOf(() =>
				assessSufficiency({ ...base, substrates: [{ component: 'glutamine', yieldGPerG: 0 }] })
			).field
		).toBe('substrates.0.yieldGPerG');
	});
});

describe('biomass composition defaults', () => {
	it('carries the Neidhardt, Ingraham & Schaechter (1990) bacterial fractions with their confidence', () => {
		const b = findBiomassComposition('bacterium-neidhardt-1990');
		// C for O, N, H, P, S; M for the rest (chemistry/REFERENCES.md).
		expect(b?.massFractions.O).toEqual({ value: 0.2, confidence: 'confirmed' });
		expect(b?.massFractions.N).toEqual({ value: 0.14, confidence: 'confirmed' });
		expect(b?.massFractions.H).toEqual({ value: 0.08, confidence: 'confirmed' });
		expect(b?.massFractions.P).toEqual({ value: 0.03, confidence: 'confirmed' });
		expect(b?.massFractions.S).toEqual({ value: 0.01, confidence: 'confirmed' });
		expect(b?.massFractions.C.confidence).toBe('from memory');
		expect(b?.massFractions.Fe.confidence).toBe('from memory');
	});

	it('derives the yeast C, H, O, N fractions from CH1.61O0.56N0.16 and keeps every profile below 1 g/g', () => {
		// CH1.61O0.56N0.16 (BioNumbers BNID 101801): M = 12.011 + 1.61 × 1.008 + 0.56 × 15.999 + 0.16 × 14.007
		// = 24.83444 g/C-mol; C = 12.011 / 24.83444 × (1 − 0.06 ash) = 0.45460.
		const y = findBiomassComposition('yeast-bionumbers-101801');
		expect(y?.massFractions.C.value).toBeCloseTo((12.011 / 24.83444) * 0.94, 6);
		expect(y?.massFractions.C.confidence).toBe('derived');
		for (const b of BIOMASS_COMPOSITIONS) {
			const sum = Object.values(b.massFractions).reduce((acc, v) => acc + v.value, 0);
			expect(sum).toBeLessThanOrEqual(1);
			expect(sum).toBeGreaterThan(0.9);
		}
	});
});
