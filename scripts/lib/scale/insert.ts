// Bulk inserts through one JSON parameter per batch: Postgres expands it with json_populate_recordset, so a
// batch of thousands of rows is one round trip and one statement, with types taken from the table itself.
import type pg from 'pg';

export async function bulkInsert(client: pg.ClientBase, table: string, rows: Record<string, unknown>[], batchSize = 5_000): Promise<void> {
  if (rows.length === 0) return;
  const columns = Object.keys(rows[0]);
  const list = columns.map((c) => `"${c}"`).join(', ');
  for (let i = 0; i < rows.length; i += batchSize) {
    const batch = rows.slice(i, i + batchSize);
    await client.query(`insert into ${table} (${list}) select ${list} from json_populate_recordset(null::${table}, $1::json)`, [JSON.stringify(batch)]);
  }
}
