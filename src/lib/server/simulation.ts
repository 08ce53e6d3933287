import { SimulationFailedError, type SimulationRequest } from '$chemistry';
import { ApiProblem } from './api/endpoint';
import { runInPool } from './simulation-pool';

const FAILURE_ADVICE: Record<SimulationFailedError['reason'], string> = {
	stepLimit:
		'the model became too stiff to follow; try a shorter end time, a gentler feed or a larger Ks',
	nonFinite: 'a value grew without bound; check the feed and the kinetic parameters',
	negativeState: 'a concentration went below zero; check the feed and the yields',
	integratorMissing: 'the integrator is not available on this server',
	regimeChatter:
		'the culture kept switching in and out of a limit (exhaustion or O2) without settling; try a smoother feed law'
};

/**
 * Runs the simulation in the worker pool; a run the integrator cannot follow is a 422 that says
 * where it stopped, never a 500 and never numbers that cannot be trusted. A run past the site's
 * time limit is stopped there (a 422 that says what to change).
 */
export async function runSimulation(request: SimulationRequest) {
	try {
		const answer = await runInPool('simulate', request);
		return new Response(answer, {
			headers: {
				'content-type': 'application/json',
				'content-length': String(Buffer.byteLength(answer))
			}
		});
	} catch (cause) {
		if (cause instanceof SimulationFailedError) {
			throw new ApiProblem(
				422,
				`The simulation did not converge at t = ${cause.tH.toFixed(2)} h: ${FAILURE_ADVICE[cause.reason]}. (${cause.message})`
			);
		}
		throw cause;
	}
}
