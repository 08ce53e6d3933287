// What an engineer or scientist waits for on a click, timed at the client over HTTP against the
// built server (validation, the worker pool, serialisation and compression included): the 14-day
// microbial fed-batch with an O2 balance and the cell-culture run at their default output, a
// study's evaluation and a recipe preview.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { SimulationRequest } from '../../chemistry/simulation';
import type { ScenarioFigure } from './bench';
import { withFreshApp, timeGet, timePost } from './http-server';
import { cellCultureRun } from '../simulation-requests';

const reference: { cases: { name: string; request: SimulationRequest }[] } = JSON.parse(
	readFileSync(
		join(import.meta.dirname, '..', 'chemistry', 'reference', 'simulation-reference.json'),
		'utf8'
	)
);

/** A request at the API's default output: without outputEveryH. */
function atDefaultOutput(request: SimulationRequest): SimulationRequest {
	const { outputEveryH: _, ...rest } = request;
	return rest;
}

const microbialWithOxygen = reference.cases.find((c) =>
	c.name.startsWith('exponential then capped feed with an O2 balance')
)!.request;

// Targets. SciPy's LSODA took ~29 ms in-process on the microbial run (fedbatch_lsoda.py); the
// round trip is to beat that. The cell-culture run's is its in-process target (simulation.bench.ts).
// 100 ms for evaluate and preview: the limit under which an answer feels immediate (Miller 1968;
// Card, Moran & Newell 1983), from memory.
const MICROBIAL_TARGET_MS = 29;
const CELL_CULTURE_TARGET_MS = 50;
const IMMEDIATE_MS = 100;

interface RecipeLineView {
	kind: 'component' | 'shelfForm' | 'stock';
	componentId: string | null;
	shelfFormId: string | null;
	stockRecipeId: string | null;
	amount: number;
	unit: string;
}

/** The preview body of a demo recipe's current lines, as the editor sends it. */
async function previewBodyOf(origin: string, cookie: string): Promise<unknown> {
	const list = await fetch(`${origin}/api/v1/recipes?limit=1`, { headers: { cookie } });
	const { items } = (await list.json()) as { items: { id: string }[] };
	const recipe = await fetch(`${origin}/api/v1/recipes/${items[0].id}/versions/1`, {
		headers: { cookie }
	});
	const { lines } = (await recipe.json()) as { lines: RecipeLineView[] };
	return {
		recipeId: items[0].id,
		lines: lines.map((line) => ({
			kind: line.kind,
			...(line.componentId ? { componentId: line.componentId } : {}),
			...(line.shelfFormId ? { shelfFormId: line.shelfFormId } : {}),
			...(line.stockRecipeId ? { stockRecipeId: line.stockRecipeId } : {}),
			amount: line.amount,
			unit: line.unit
		}))
	};
}

async function firstStudyId(origin: string, cookie: string): Promise<string> {
	const list = await fetch(`${origin}/api/v1/studies`, { headers: { cookie } });
	const { items } = (await list.json()) as { items: { id: string }[] };
	return items[0].id;
}

export function scenario(): Promise<ScenarioFigure[]> {
	return withFreshApp('requests', async (app) => {
		const { origin } = app;
		const engineer = await app.signIn('engineer@demo.test');
		const scientist = await app.signIn('scientist@demo.test');
		const figures: ScenarioFigure[] = [];
		const add = (name: string, ms: number, bytes: number, target: number) => {
			figures.push({ name, value: ms, target, unit: 'ms' });
			figures.push({ name: `  size of the answer`, value: bytes / 1024, unit: 'KB' });
		};
		const simulate = (request: SimulationRequest) =>
			timePost(`${origin}/api/v1/simulate`, engineer, request);
		const microbial = await simulate(atDefaultOutput(microbialWithOxygen));
		add(
			'POST /api/v1/simulate: 14-day microbial fed-batch, O2 balance',
			microbial.medianMs,
			microbial.bytes,
			MICROBIAL_TARGET_MS
		);
		const cellCulture = await simulate(atDefaultOutput(cellCultureRun));
		add(
			'POST /api/v1/simulate: 14-day cell-culture fed-batch, DO-stat',
			cellCulture.medianMs,
			cellCulture.bytes,
			CELL_CULTURE_TARGET_MS
		);
		const studyId = await firstStudyId(origin, engineer);
		const evaluate = await timePost(`${origin}/api/v1/studies/evaluate`, engineer, { studyId });
		add(
			'POST /api/v1/studies/evaluate: a demo study',
			evaluate.medianMs,
			evaluate.bytes,
			IMMEDIATE_MS
		);
		const preview = await timePost(
			`${origin}/api/v1/recipes/preview`,
			scientist,
			await previewBodyOf(origin, scientist)
		);
		add(
			'POST /api/v1/recipes/preview: a demo recipe',
			preview.medianMs,
			preview.bytes,
			IMMEDIATE_MS
		);
		const page = await timeGet(`${origin}/simulation`, engineer);
		figures.push({
			name: 'GET /simulation',
			value: page.medianMs,
			target: IMMEDIATE_MS,
			unit: 'ms'
		});
		return figures;
	});
}
