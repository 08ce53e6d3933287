import { RuleError } from '../rule-error';

export { actorOf } from '../guard';

export function versionNumber(raw: string): number {
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 1)
		throw new RuleError(`“${raw}” is not a version number.`, { status: 404 });
	return n;
}
