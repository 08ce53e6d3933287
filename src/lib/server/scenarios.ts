import { and, desc, eq, ne } from 'drizzle-orm';
import type { SimulateRequest } from './api/operations/simulation';
import { recordAudit, type Actor } from './audit';
import { db } from './db';
import { simulationScenario, type SimulationScenario } from './db/schema';
import { RuleError } from './rule-error';

export interface ScenarioView {
	id: string;
	name: string;
	mode: SimulateRequest['mode'];
	notes: string | null;
	request: SimulateRequest;
	createdAt: string;
	updatedAt: string;
}

type Owner = Actor & { id: string };

function toView(row: SimulationScenario): ScenarioView {
	return {
		id: row.id,
		name: row.name,
		mode: row.mode,
		notes: row.notes,
		request: row.request,
		createdAt: row.createdAt.toISOString(),
		updatedAt: row.updatedAt.toISOString()
	};
}

function requireFreeName(ownerId: string, name: string, exceptId?: string): void {
	const clash = db
		.select({ id: simulationScenario.id })
		.from(simulationScenario)
		.where(
			and(
				eq(simulationScenario.ownerId, ownerId),
				eq(simulationScenario.name, name),
				exceptId ? ne(simulationScenario.id, exceptId) : undefined
			)
		)
		.get();
	if (clash) {
		throw new RuleError(`You already have a scenario called “${name}”; choose another name.`, {
			field: 'name',
			status: 409
		});
	}
}

export function listScenarios(ownerId: string): ScenarioView[] {
	return db
		.select()
		.from(simulationScenario)
		.where(eq(simulationScenario.ownerId, ownerId))
		.orderBy(desc(simulationScenario.updatedAt), simulationScenario.name)
		.all()
		.map(toView);
}

/** Someone else's scenario answers as missing, so ids reveal nothing. */
export function getScenario(ownerId: string, id: string): ScenarioView {
	const row = db
		.select()
		.from(simulationScenario)
		.where(and(eq(simulationScenario.id, id), eq(simulationScenario.ownerId, ownerId)))
		.get();
	if (!row) throw new RuleError('No such scenario among yours.', { status: 404 });
	return toView(row);
}

export function saveScenario(
	owner: Owner,
	input: { name: string; notes?: string | null; request: SimulateRequest }
): ScenarioView {
	const name = input.name.trim();
	return db.transaction((tx) => {
		requireFreeName(owner.id, name);
		const row = tx
			.insert(simulationScenario)
			.values({
				ownerId: owner.id,
				name,
				mode: input.request.mode,
				request: input.request,
				notes: input.notes?.trim() || null
			})
			.returning()
			.get();
		recordAudit(
			owner,
			{
				action: 'simulation.scenario_saved',
				subjectType: 'simulation_scenario',
				subjectId: row.id,
				detail: { name, mode: row.mode }
			},
			tx
		);
		return toView(row);
	});
}

export function updateScenario(
	owner: Owner,
	id: string,
	changes: { name?: string; notes?: string | null }
): ScenarioView {
	return db.transaction((tx) => {
		const before = getScenario(owner.id, id);
		const name = changes.name?.trim() ?? before.name;
		if (name !== before.name) requireFreeName(owner.id, name, id);
		const notes = changes.notes === undefined ? before.notes : changes.notes?.trim() || null;
		const row = tx
			.update(simulationScenario)
			.set({ name, notes, updatedAt: new Date() })
			.where(eq(simulationScenario.id, id))
			.returning()
			.get();
		recordAudit(
			owner,
			{
				action: 'simulation.scenario_updated',
				subjectType: 'simulation_scenario',
				subjectId: id,
				detail: { from: before.name, to: name }
			},
			tx
		);
		return toView(row);
	});
}

export function deleteScenario(owner: Owner, id: string): void {
	db.transaction((tx) => {
		const before = getScenario(owner.id, id);
		tx.delete(simulationScenario).where(eq(simulationScenario.id, id)).run();
		recordAudit(
			owner,
			{
				action: 'simulation.scenario_deleted',
				subjectType: 'simulation_scenario',
				subjectId: id,
				detail: { name: before.name, mode: before.mode }
			},
			tx
		);
	});
}
