import type { Page } from '@playwright/test';

/**
 * Run data from the model itself (Monod 1949 batch, μmax 0.6 /h, Ks 0.05 g/L, Yx/s 0.5, from 0.05 g/L
 * on 10 g/L), every 0.5 h over 14 h, through the API: what a fit should give back.
 */
export async function simulateMonodBatch(
	page: Page
): Promise<{ t: number[]; biomassGPerL: number[]; substrateGPerL: number[] }> {
	const simulated = await page.request.post('/api/v1/simulate', {
		data: {
			mode: 'batch',
			kinetics: { muMaxPerH: 0.6, ksGPerL: 0.05, yieldXS: 0.5 },
			initial: { biomassGPerL: 0.05, substrateGPerL: 10, volumeL: 2 },
			endH: 14,
			outputEveryH: 0.5
		}
	});
	return simulated.json();
}
