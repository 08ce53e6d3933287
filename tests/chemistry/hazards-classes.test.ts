import { describe, expect, it } from 'vitest';
import {
	HAZARD_CLASSES,
	HAZARD_STATEMENTS,
	hazardStatementInfo,
	labelElementsOf,
	protectiveEquipment,
	splitHazardCode
} from '../../chemistry';
import { GHS_STATEMENTS } from '../../chemistry/data/components';

describe('hazard statements and their classes (UN GHS Rev. 10, Annex 1 and Annex 3)', () => {
	it.each([
		// [code, class, category, pictograms, signal word]: Annex 1 label elements per category.
		['H314', 'skin-corrosion-irritation', '1 (1A, 1B, 1C)', ['GHS05'], 'Danger'],
		['H315', 'skin-corrosion-irritation', '2', ['GHS07'], 'Warning'],
		['H318', 'eye-damage-irritation', '1', ['GHS05'], 'Danger'],
		['H319', 'eye-damage-irritation', '2A', ['GHS07'], 'Warning'],
		['H302', 'acute-toxicity-oral', '4', ['GHS07'], 'Warning'],
		['H300', 'acute-toxicity-oral', '1, 2', ['GHS06'], 'Danger'],
		['H334', 'respiratory-sensitisation', '1 (1A, 1B)', ['GHS08'], 'Danger'],
		['H225', 'flammable-liquid', '2', ['GHS02'], 'Danger'],
		['H226', 'flammable-liquid', '3', ['GHS02'], 'Warning'],
		['H271', 'oxidising-liquid-or-solid', '1', ['GHS03'], 'Danger'],
		['H280', 'gas-under-pressure', 'Compressed, liquefied or dissolved gas', ['GHS04'], 'Warning'],
		['H290', 'corrosive-to-metals', '1', ['GHS05'], 'Warning'],
		['H241', 'self-reactive-or-peroxide', 'Type B', ['GHS01', 'GHS02'], 'Danger'],
		['H410', 'aquatic-chronic', 'Chronic 1', ['GHS09'], 'Warning'],
		['H411', 'aquatic-chronic', 'Chronic 2', ['GHS09'], null],
		['H412', 'aquatic-chronic', 'Chronic 3', [], null]
	])('%s is %s category %s', (code, hazardClass, category, pictograms, signalWord) => {
		expect(hazardStatementInfo(code)).toMatchObject({
			hazardClass,
			category,
			pictograms,
			signalWord
		});
	});

	it('knows every statement the component library uses, with the same text', () => {
		for (const [code, text] of Object.entries(GHS_STATEMENTS)) {
			expect([code, HAZARD_STATEMENTS[code]?.text]).toEqual([code, text]);
		}
	});

	it('groups the classes into physical, health and environmental', () => {
		expect(HAZARD_CLASSES[HAZARD_STATEMENTS.H272.hazardClass].group).toBe('physical');
		expect(HAZARD_CLASSES[HAZARD_STATEMENTS.H373.hazardClass].group).toBe('health');
		expect(HAZARD_CLASSES[HAZARD_STATEMENTS.H411.hazardClass].group).toBe('environmental');
	});

	it('reads combined and loosely typed codes', () => {
		expect(splitHazardCode('H300+H310+H330')).toEqual(['H300', 'H310', 'H330']);
		expect(splitHazardCode(' h319 ')).toEqual(['H319']);
		expect(hazardStatementInfo('H360Fd')?.category).toBe('1 (fertility), 2 (development)');
		expect(hazardStatementInfo('H999')).toBeUndefined();
	});
});

describe('label elements with the precedence rules (UN GHS Rev. 10, 1.4.10.5.3)', () => {
	it('drops the exclamation mark where a stronger symbol covers it', () => {
		// (a) skull and crossbones: no exclamation mark.
		expect(labelElementsOf(['H301', 'H302', 'H335']).pictograms).toEqual(['GHS06']);
		// (b) corrosion: none for skin or eye irritation, but kept for sensitisation.
		expect(labelElementsOf(['H314', 'H315']).pictograms).toEqual(['GHS05']);
		expect(labelElementsOf(['H314', 'H317']).pictograms).toEqual(['GHS05', 'GHS07']);
		// (c) health hazard for respiratory sensitisation: none for skin sensitisation.
		expect(labelElementsOf(['H334', 'H317']).pictograms).toEqual(['GHS08']);
		expect(labelElementsOf(['H373', 'H317']).pictograms).toEqual(['GHS07', 'GHS08']);
	});

	it('uses Danger over Warning, and no word for statements without one', () => {
		expect(labelElementsOf(['H302', 'H318']).signalWord).toBe('Danger');
		expect(labelElementsOf(['H302']).signalWord).toBe('Warning');
		expect(labelElementsOf(['H412']).signalWord).toBeNull();
	});
});

describe('protective equipment (UN GHS Rev. 10, Annex 3 prevention statements)', () => {
	const ids = (...codes: string[]) => protectiveEquipment(codes).map((p) => p.id);

	it('asks for gloves, coat, goggles and face shield for a corrosive (P280)', () => {
		expect(ids('H290', 'H314')).toEqual(['gloves', 'lab-coat', 'eye-protection', 'face-shield']);
	});

	it('asks only for what the condition of use names', () => {
		// Skin irritation and sensitisation: P280 gloves; eye irritation: P280 eye protection.
		expect(ids('H315', 'H317')).toEqual(['gloves']);
		expect(ids('H319')).toEqual(['eye-protection']);
		// Swallowing hazards and aquatic hazards call for no equipment (P264, P270, P273).
		expect(ids('H302', 'H410')).toEqual([]);
	});

	it('sends inhalation hazards to the fume hood and respiratory sensitisers to a respirator', () => {
		// H331/H335: P261 + P271; H334: P261 + P284; H330: P260 + P271 + P284.
		expect(ids('H335')).toEqual(['fume-hood']);
		const equipment = protectiveEquipment(['H331', 'H334']);
		expect(equipment.map((p) => [p.id, p.codes, p.precautionaryStatements])).toEqual([
			['fume-hood', ['H331', 'H334'], ['P261', 'P271']],
			['respirator', ['H334'], ['P284']]
		]);
	});
});
