/**
 * The personal protective equipment a set of hazard statements calls for, read from the
 * prevention precautionary statements the GHS assigns to each hazard class and category and their
 * conditions of use: UN GHS Rev. 10, Annex 3, section 3 (recalled, not copied: check a new class
 * against the annex).
 *
 * - P280 "Wear protective gloves/protective clothing/eye protection/face protection": the parts
 *   its condition of use names per class: gloves only for skin irritation and sensitisation; eye
 *   and face protection for eye damage and irritation; gloves and clothing for dermal toxicity;
 *   all of them for skin corrosion, CMR substances and reactive or flammable materials.
 * - P282 (refrigerated gas): cold-insulating gloves and eye or face protection.
 * - P260/P261 "Do not breathe / avoid breathing dust, mist, vapours" with P271 "use only in a
 *   well-ventilated area" (inhalation hazards, respiratory sensitisers): at the bench that is a fume
 *   hood or local exhaust.
 * - P284 "[In case of inadequate ventilation] wear respiratory protection": fatal by inhalation and
 *   respiratory sensitisers.
 * A face shield for skin corrosives (P280's face protection) is where splashing burns; H350i
 * (cancer by inhalation) in the fume hood is common practice.
 */
import { splitHazardCode } from './classes';

export type ProtectiveEquipmentId =
	'gloves' | 'eye-protection' | 'face-shield' | 'lab-coat' | 'fume-hood' | 'respirator';

export interface ProtectiveEquipment {
	id: ProtectiveEquipmentId;
	text: string;
	/** The hazard statements given that call for it. */
	codes: string[];
	/** The precautionary statements it answers (P280 …), or 'common practice'. */
	precautionaryStatements: string[];
}

const REACTIVE_OR_FLAMMABLE = [
	...['H224', 'H225', 'H226', 'H228', 'H240', 'H241', 'H242'],
	...['H250', 'H251', 'H252', 'H260', 'H261', 'H271', 'H272']
];
const CMR = [
	...['H340', 'H341', 'H350', 'H350i', 'H351'],
	...['H360', 'H360F', 'H360D', 'H360FD', 'H360Fd', 'H360Df'],
	...['H361', 'H361f', 'H361d', 'H361fd']
];
const DERMAL_TOXICITY = ['H310', 'H311', 'H312'];

type Because = readonly [precautionary: string, codes: readonly string[]];

const EQUIPMENT: readonly {
	id: ProtectiveEquipmentId;
	text: string;
	because: readonly Because[];
}[] = [
	{
		id: 'gloves',
		text: 'Protective gloves',
		because: [
			['P280', [...REACTIVE_OR_FLAMMABLE, ...DERMAL_TOXICITY, 'H314', 'H315', 'H317', ...CMR]],
			['P282', ['H281']]
		]
	},
	{
		id: 'lab-coat',
		text: 'Lab coat or other protective clothing',
		because: [['P280', [...REACTIVE_OR_FLAMMABLE, ...DERMAL_TOXICITY, 'H314', ...CMR]]]
	},
	{
		id: 'eye-protection',
		text: 'Safety glasses or goggles',
		because: [
			['P280', [...REACTIVE_OR_FLAMMABLE, 'H314', 'H318', 'H319', ...CMR]],
			['P282', ['H281']]
		]
	},
	{
		id: 'face-shield',
		text: 'Face shield over the goggles when pouring or where it can splash',
		because: [['P280', ['H314']]]
	},
	{
		id: 'fume-hood',
		text: 'Work in a fume hood or with local exhaust',
		because: [
			['P260', ['H330']],
			['P261', ['H331', 'H332', 'H334', 'H335', 'H336']],
			['P271', ['H330', 'H331', 'H332', 'H335', 'H336']],
			['common practice', ['H350i']]
		]
	},
	{
		id: 'respirator',
		text: 'Respiratory protection where the ventilation is not enough',
		because: [['P284', ['H330', 'H334']]]
	}
];

export function protectiveEquipment(codes: readonly string[]): ProtectiveEquipment[] {
	const given = new Set(codes.flatMap(splitHazardCode));
	return EQUIPMENT.flatMap(({ id, text, because }) => {
		const matched = because.filter(([, calledBy]) => calledBy.some((c) => given.has(c)));
		if (matched.length === 0) return [];
		const calling = new Set(
			matched.flatMap(([, calledBy]) => calledBy.filter((c) => given.has(c)))
		);
		return [
			{
				id,
				text,
				codes: [...calling].sort((a, b) => a.localeCompare(b, 'en', { numeric: true })),
				precautionaryStatements: [...new Set(matched.map(([p]) => p))]
			}
		];
	});
}
