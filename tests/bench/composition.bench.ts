import type { BenchCase } from './bench';
import { REFERENCE_COMPONENTS } from '../../chemistry/components';
import { computeComposition, type CompositionLine } from '../../chemistry/composition';

// A 60-line recipe from the reference data; amounts are demo values, cycling through the units.
const units = ['g/L', 'mg/L', 'mM', 'µM', '% w/v'];
const lines: CompositionLine[] = REFERENCE_COMPONENTS.slice(0, 60).map((component, i) => {
	const unit = component.molarMassGPerMol === null ? 'g/L' : units[i % units.length];
	const amount = { 'g/L': 0.5, 'mg/L': 20, mM: 0.8, µM: 15, '% w/v': 0.01 }[unit] ?? 1;
	return { component, amount, unit };
});
if (lines.length !== 60) throw new Error('the bench needs 60 reference components');

export const benches: BenchCase[] = [
	{
		name: 'composition: 60-line recipe',
		targetMs: 1,
		run: () => computeComposition({ lines, temperatureC: 20, volumeL: 10 })
	},
	{
		// Components loaded afresh from a database are new objects each request: no per-object cache hit.
		name: 'composition: 60-line recipe, fresh component objects',
		targetMs: 1,
		run: () =>
			computeComposition({
				lines: lines.map((l) => ({ ...l, component: { ...l.component } })),
				temperatureC: 20,
				volumeL: 10
			})
	}
];
