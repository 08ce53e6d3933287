import type { SimpleField } from '$lib/simulation/number-fields';

/** The growth constants both steady-state panels ask for first, with the same labels. */
export const MONOD_GROWTH_FIELDS: SimpleField[] = [
	{ key: 'muMaxPerH', label: 'μmax (1/h)' },
	{ key: 'ksGPerL', label: 'Ks (g/L)' },
	{ key: 'yieldXS', label: 'Yx/s (g/g)', hint: 'True growth yield, before maintenance' }
];

/** Pirt's maintenance coefficient, optional; `where` says where the panel applies it. */
export function maintenanceField(where: string): SimpleField {
	return {
		key: 'maintenanceGPerGH',
		label: 'Maintenance m_s (g/g/h)',
		hint: `g substrate per g biomass per hour (Pirt)${where}; 0 or blank for none`
	};
}

/** The same starting values for the shared fields, so both panels open on one organism. */
export const MONOD_GROWTH_DEFAULTS = {
	muMaxPerH: '0.6',
	ksGPerL: '0.05',
	yieldXS: '0.5'
};
