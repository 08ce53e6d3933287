import { getTableColumns, getTableName, sql, type Table } from 'drizzle-orm';
import type { Db } from '../db';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * Copies the rows a `where` picks from `table`, `copies` times, in one INSERT … SELECT over a
 * recursive count `n.i` (1 … copies), with the database's triggers active. `override` gives SQL
 * for the columns that must differ per copy (ids, codes), written over `t` (the row) and `n.i`.
 */
export function cloneRows(
	tx: Tx,
	table: Table,
	where: string,
	copies: number,
	override: Record<string, string>
): void {
	const names = Object.values(getTableColumns(table)).map((c) => c.name);
	const tableName = getTableName(table);
	const into = names.map((n) => `"${n}"`).join(', ');
	const values = names.map((n) => override[n] ?? `t."${n}"`).join(', ');
	tx.run(
		sql.raw(
			`insert into "${tableName}" (${into}) ` +
				`with recursive n(i) as (select 1 union all select i + 1 from n where i < ${copies}) ` +
				`select ${values} from n, "${tableName}" t where ${where}`
		)
	);
}
