/** What PostgreSQL's pg_stat_statements says of a benchmark's run (its cluster started with statementStats). */
import { withClient } from '../../scripts/lib/postgres';

type Row = Record<string, string | number>;

/** The statements that took the most database time in the whole run (every server's), planning included. */
export async function statementStats(databaseUrl: string): Promise<Row[]> {
  return withClient(databaseUrl, async (client) => {
    await client.query('CREATE EXTENSION IF NOT EXISTS pg_stat_statements');
    const { rows } = await client.query<Row>(
      `SELECT calls, round(total_exec_time::numeric, 1) AS run_ms, round(total_plan_time::numeric, 1) AS plan_ms,
              round(((total_exec_time + total_plan_time) / greatest(calls, 1))::numeric, 3) AS ms_per_call,
              left(regexp_replace(query, '\\s+', ' ', 'g'), 110) AS statement
         FROM pg_stat_statements WHERE calls > 50
        ORDER BY total_exec_time + total_plan_time DESC LIMIT 15`,
    );
    return rows;
  });
}
