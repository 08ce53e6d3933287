// The science calculations' request and response schemas live beside the science (chemistry/);
// here is only what the OpenAPI document says of each operation.
import {
	AIR_O2_MOLE_FRACTION,
	AIR_O2_MOLE_FRACTION_SOURCE,
	formulaRequest,
	formulaResponse,
	oxygenSaturationRequest,
	oxygenSaturationResponse,
	stoichiometryRequest,
	stoichiometryResponse,
	sufficiencyRequest,
	sufficiencyResponse
} from '$chemistry';
import type { ApiOperation } from '../openapi';

export const chemistryOperations: ApiOperation[] = [
	{
		method: 'post',
		path: '/api/v1/formula',
		summary:
			'Parses a chemical formula (hydrates, decimal subscripts) and gives its molar mass and element counts',
		act: 'calculation.run',
		request: formulaRequest,
		response: formulaResponse
	},
	{
		method: 'post',
		path: '/api/v1/stoichiometry',
		summary:
			'Solves a black-box growth balance by element balances (C, H, O, N; P, S optional). Consumed rates are negative, produced positive; a molarRatio is |numerator|/|denominator|; biomass grams include ash',
		act: 'calculation.run',
		request: stoichiometryRequest,
		response: stoichiometryResponse
	},
	{
		method: 'post',
		path: '/api/v1/oxygen/saturation',
		summary: `Dissolved-oxygen saturation: Benson & Krause (1984) as given in APHA Standard Methods 4500-O by default, or Garcia & Gordon (1992). Defaults: salinity 0 g/kg, 101.325 kPa, o2MoleFraction ${AIR_O2_MOLE_FRACTION} (dry air; ${AIR_O2_MOLE_FRACTION_SOURCE})`,
		act: 'calculation.run',
		request: oxygenSaturationRequest,
		response: oxygenSaturationResponse
	},
	{
		method: 'post',
		path: '/api/v1/sufficiency',
		summary:
			'Demand, supply, ratio and margin per element or component for a target biomass; names the limiting required nutrient and the maximum supportable biomass after the safety factor (default 1.2, common practice). Each line carries its role (required, or trace: a short trace element is a warning, never the limit), how sure its value is and its source',
		act: 'calculation.run',
		request: sufficiencyRequest,
		response: sufficiencyResponse
	}
];
