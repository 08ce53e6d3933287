// The chemostat and batch-against-continuous panels: their fields, and their typed text turned into
// the request each posts, checked with the request schema the API validates with. A refusal in the
// panel reads as the API's would, with the field named by its label.
import {
	batchVersusContinuousRequest,
	chemostatRequest,
	numberMessage,
	SAFETY_MARGIN_BOUNDS,
	type BatchVersusContinuousRequest,
	type ChemostatRequest
} from '$chemistry';
import { MONOD_GROWTH_FIELDS, maintenanceField } from '$lib/components/simulation/monod-fields';
import {
	checkFieldsRequest,
	nestFields,
	readSimpleFields,
	type CheckedFields,
	type SimpleField
} from './number-fields';

export const CHEMOSTAT_FIELDS: SimpleField[] = [
	...MONOD_GROWTH_FIELDS,
	{ key: 'feedSubstrateGPerL', label: 'Feed substrate Sf (g/L)' },
	maintenanceField(''),
	{ key: 'dilutionPerH', label: 'Dilution rate D (1/h)' },
	{
		key: 'safetyMarginPercent',
		label: 'Safety margin below D_crit (%)',
		hint: 'Operate at most this far below washout; blank for none'
	}
];

export const BATCH_CONTINUOUS_FIELDS: SimpleField[] = [
	...MONOD_GROWTH_FIELDS,
	{ key: 'substrateGPerL', label: 'Substrate S₀ = Sf (g/L)' },
	maintenanceField(', in batch and chemostat'),
	{ key: 'inoculumGPerL', label: 'Batch inoculum X₀ (g/L)' },
	{ key: 'dilutionPerH', label: 'Chemostat D (1/h)' },
	{ key: 'turnaround.cleaningH', label: 'Cleaning (h)' },
	{ key: 'turnaround.sterilisingH', label: 'Sterilising (h)' },
	{ key: 'turnaround.fillingH', label: 'Filling (h)' },
	{ key: 'turnaround.lagH', label: 'Lag (h)' },
	{ key: 'conversion', label: 'Substrate used at harvest (fraction)', hint: 'Default 0.99' }
];

/** The margin's range as the panel asks for it, in percent. */
const SAFETY_MARGIN_PERCENT_BOUNDS = {
	...SAFETY_MARGIN_BOUNDS,
	min: (SAFETY_MARGIN_BOUNDS.min ?? 0) * 100,
	max: (SAFETY_MARGIN_BOUNDS.max ?? 1) * 100
};

/** The chemostat panel's request; the margin is typed in percent and sent as a fraction. */
export function checkChemostatFields(
	values: Record<string, string>
): CheckedFields<ChemostatRequest> {
	const { numbers, textErrors } = readSimpleFields(CHEMOSTAT_FIELDS, values);
	const { safetyMarginPercent, ...rest } = numbers;
	const body =
		safetyMarginPercent === undefined ? rest : { ...rest, safetyMargin: safetyMarginPercent / 100 };
	const checked = checkFieldsRequest(chemostatRequest, CHEMOSTAT_FIELDS, textErrors, body);
	if (checked.ok || !('safetyMargin' in checked.fieldErrors)) return checked;
	const others = Object.fromEntries(
		Object.entries(checked.fieldErrors).filter(([key]) => key !== 'safetyMargin')
	);
	const label = CHEMOSTAT_FIELDS.find((f) => f.key === 'safetyMarginPercent')!.label;
	return {
		ok: false,
		fieldErrors: {
			...others,
			safetyMarginPercent: numberMessage(label, safetyMarginPercent, SAFETY_MARGIN_PERCENT_BOUNDS)
		}
	};
}

/** The batch-against-continuous panel's request; the turnaround steps nest under `turnaround`. */
export function checkBatchContinuousFields(
	values: Record<string, string>
): CheckedFields<BatchVersusContinuousRequest> {
	const { numbers, textErrors } = readSimpleFields(BATCH_CONTINUOUS_FIELDS, values);
	const body = { turnaround: {}, ...nestFields(numbers) };
	return checkFieldsRequest(
		batchVersusContinuousRequest,
		BATCH_CONTINUOUS_FIELDS,
		textErrors,
		body
	);
}
