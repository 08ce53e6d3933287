import { describe, expect, it } from 'vitest';
import { ATOMIC_WEIGHTS, formulaMolarMass, listYieldsUsed } from '$chemistry';
import { createProfileForm } from './profile-form';
import { useDemoDatabase } from './demo-database';

useDemoDatabase();

const { saved, failure } = createProfileForm('Profile', {
	group: 'bacterium',
	kind: 'elementalFractions',
	elementalFractions: 'C 0.5\nN 0.14\nP 0.03',
	biomassFormula: 'CH1.666667O0.5N0.166667',
	carbonSourceId: 'd-glucose',
	muMaxPerH: '0.5',
	ksGPerL: '0.05'
});

describe('Yx/s worked out on the profile form', () => {
	it('from the measured RQ: the Shuler & Kargi (2002) glucose balance, Yx/s 0.384 at RQ 1.04', () => {
		const row = saved({ yieldXSMethod: 'respiratoryQuotient', respiratoryQuotient: '1.04' });
		expect(row.yieldXSMethod).toBe('respiratoryQuotient');
		expect(row.yieldXSGPerG).toBeCloseTo(0.384, 3);
		const used = listYieldsUsed(row, {
			componentNames: { 'd-glucose': 'D-Glucose' },
			componentFormulas: { 'd-glucose': 'C6H12O6' }
		});
		expect(used[0].source).toMatch(
			/Element balance .* from RQ 1.04; a 1 % error in it moves Yx\/s by about 13 %/
		);
	});

	it('from Yx/O2 0.721 g/g: the same balance, Yx/s 0.384', () => {
		const row = saved({ yieldXSMethod: 'oxygenYield', yieldXO2GPerG: '0.721' });
		expect(row.yieldXSGPerG).toBeCloseTo(0.384, 2);
	});

	it('ignores a typed Yx/s when a balance method is chosen, and keeps it when entered', () => {
		expect(
			saved({
				yieldXSMethod: 'respiratoryQuotient',
				respiratoryQuotient: '1.04',
				yieldXSGPerG: '0.9'
			}).yieldXSGPerG
		).toBeCloseTo(0.384, 3);
		expect(saved({ yieldXSMethod: 'entered', yieldXSGPerG: '0.45' }).yieldXSGPerG).toBe(0.45);
	});

	it('refuses a typed Yx/s above the element-balance bound on glucose, with the bound and why', () => {
		// Biomass CH1.666667O0.5N0.166667: γx = 4 + 1.666667 − 1 − 0.5 = 4.166667; glucose γs = 4.
		// Bound 4/4.166667 C-mol/C-mol × M(biomass per C-mol) / (M(glucose)/6), hand-computed here.
		const biomassGPerCmol = formulaMolarMass('CH1.666667O0.5N0.166667');
		const boundGPerG = ((4 / 4.166667) * biomassGPerCmol) / (formulaMolarMass('C6H12O6') / 6);
		const refused = failure({ yieldXSMethod: 'entered', yieldXSGPerG: '1.5', notes: 'kept' });
		const message = refused.fieldErrors.yieldXSGPerG[0];
		expect(message).toMatch(
			/^Yx\/s 1\.5 g\/g is more than the element balances allow on D-Glucose/
		);
		expect(message).toContain(`at most ${boundGPerG.toPrecision(3)} g/g`);
		expect(message).toMatch(/degree-of-reduction balance/);
		expect(refused.values.notes).toBe('kept');
		expect(saved({ yieldXSMethod: 'entered', yieldXSGPerG: '0.7' }).yieldXSGPerG).toBe(0.7);
	});

	it('says what is missing for the balance, keeping what was typed', () => {
		const noRq = failure({ yieldXSMethod: 'respiratoryQuotient', notes: 'kept' });
		expect(noRq.fieldErrors.respiratoryQuotient[0]).toMatch(/Enter the measured RQ/);
		expect(noRq.values.notes).toBe('kept');
		expect(failure({ yieldXSMethod: 'oxygenYield' }).fieldErrors.yieldXO2GPerG[0]).toMatch(
			/Enter Yx\/O2, or qO2 with μmax/
		);
		expect(
			failure({
				yieldXSMethod: 'respiratoryQuotient',
				respiratoryQuotient: '1.04',
				biomassFormula: ''
			}).fieldErrors.biomassFormula[0]
		).toMatch(/biomass formula/);
		expect(
			failure({ yieldXSMethod: 'respiratoryQuotient', respiratoryQuotient: '1.0' }).fieldErrors
				.yieldXSMethod[0]
		).toMatch(/growth/);
		expect(
			failure({ yieldXSMethod: 'respiratoryQuotient', respiratoryQuotient: '0.5' }).fieldErrors
				.yieldXSMethod[0]
		).toMatch(/cannot have an RQ of 0.5/);
	});
});

describe('yields on further substrates', () => {
	it('stores entered yields and element-balance yields of a sole N source', () => {
		const row = saved({
			yieldXSGPerG: '0.5',
			substrateYields: 'l-glutamine 0.7\nammonium-sulfate from N'
		});
		// (NH4)2SO4: 2 × 14.007 / 132.134 = 0.2120 g N per g, against the profile's 14 % N (IUPAC 2021 weights).
		const expected = (2 * ATOMIC_WEIGHTS.N) / formulaMolarMass('(NH4)2SO4') / 0.14;
		expect(row.substrateYields).toEqual([
			{ componentId: 'l-glutamine', method: 'entered', yieldGPerG: 0.7 },
			{
				componentId: 'ammonium-sulfate',
				method: 'soleSource',
				element: 'N',
				yieldGPerG: Number(expected.toPrecision(4))
			}
		]);
		const used = listYieldsUsed(row, { componentNames: {}, componentFormulas: {} });
		expect(used.map((u) => u.what)).toEqual([
			'Yx/s on d-glucose',
			'Yx/s on l-glutamine',
			'Yx/s on ammonium-sulfate'
		]);
		expect(used[2].source).toMatch(/only source of N/);
	});

	it('refuses each kind of bad line with a message naming it', () => {
		const msg = (text: string) =>
			failure({ yieldXSGPerG: '0.5', substrateYields: text }).fieldErrors.substrateYields[0];
		expect(msg('l-glutamine')).toMatch(/should be a component id and a yield/);
		expect(msg('no-such-thing 0.5')).toMatch(/No component “no-such-thing”/);
		expect(msg('d-glucose 0.5')).toMatch(/is the carbon source/);
		expect(msg('l-glutamine 0.5\nl-glutamine 0.6')).toMatch(/listed twice/);
		expect(msg('l-glutamine 0')).toMatch(/above 0/);
		expect(msg('d-glucose-free from N')).toMatch(/No component/);
		expect(msg('potassium-chloride from N')).toMatch(/contains no N/);
	});

	it('refuses a yield on a component that also has a per-cell rate', () => {
		const f = failure({
			kind: 'perCell',
			group: 'mammalian',
			cellDryMassPg: '300',
			elementalFractions: '',
			perCellConsumption: 'l-glutamine 3 mmol',
			yieldXSGPerG: '0.2',
			substrateYields: 'l-glutamine 0.68'
		});
		expect(f.fieldErrors.substrateYields[0]).toMatch(
			/both a per-cell consumption rate and a yield/
		);
	});
});
