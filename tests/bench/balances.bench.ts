import type { BenchCase } from './bench';
import { REFERENCE_COMPONENTS } from '../../chemistry/components';
import { computeComposition } from '../../chemistry/composition';
import { solveStoichiometry, type StoichiometryInput } from '../../chemistry/stoichiometry';
import { assessSufficiency, type SufficiencyInput } from '../../chemistry/sufficiency';

const aerobicGlucose: StoichiometryInput = {
	species: [
		{ id: 'glucose', formula: 'C6H12O6', role: 'substrate' },
		{ id: 'o2', formula: 'O2' },
		{ id: 'nh3', formula: 'NH3' },
		{ id: 'biomass', formula: 'CH1.8O0.5N0.2', ashFraction: 0.05 },
		{ id: 'co2', formula: 'CO2' },
		{ id: 'h2o', formula: 'H2O' }
	],
	specifications: [
		{ kind: 'rate', species: 'glucose', mol: -1 },
		{ kind: 'massYield', product: 'biomass', substrate: 'glucose', gPerG: 0.5 }
	]
};

// A 60-line recipe through the composition engine: its element totals and per-component g/L are
// the supply. Built once; the bench times the sufficiency assessment only.
const recipe = computeComposition({
	lines: REFERENCE_COMPONENTS.filter((c) => c.formula)
		.slice(0, 60)
		.map((component) => ({ component, amount: 0.2, unit: 'g/L' }))
});
if (recipe.components.length !== 60)
	throw new Error(`expected 60 recipe lines, got ${recipe.components.length}`);

const recipeSupply: SufficiencyInput = {
	profile: { kind: 'preset', id: 'bacterium-neidhardt-1990' },
	target: { biomassGPerL: 20 },
	supply: {
		finalVolumeL: 1.2,
		sources: [
			{
				name: '60-line medium',
				volumeL: 1,
				elementsGPerL: Object.fromEntries(recipe.elements.map((e) => [e.symbol, e.gPerL])),
				componentsGPerL: Object.fromEntries(recipe.components.map((c) => [c.id, c.gPerL]))
			},
			{ name: 'glucose feed', volumeL: 0.2, componentsGPerL: { 'd-glucose': 500 } }
		]
	},
	carbon: { basis: 'component', component: 'd-glucose', yieldGPerG: 0.5 }
};

export const benches: BenchCase[] = [
	{
		name: 'stoichiometry: aerobic glucose balance',
		targetMs: 1,
		run: () => solveStoichiometry(aerobicGlucose)
	},
	{
		name: 'sufficiency: 60-line recipe supply',
		targetMs: 1,
		run: () => assessSufficiency(recipeSupply)
	}
];
