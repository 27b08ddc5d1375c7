// The SQL statements a step of a test runs, with their bound values, as Sequelize hands them to the database.
import { vi } from "vitest";
import { sequelize } from "~/utils/db.server";

export type Statement = { sql: string; bind: Record<string, unknown> };

/** Every statement run while `run` does, in order. */
export async function statementsWhile(run: () => Promise<unknown>): Promise<Statement[]> {
  const statements: Statement[] = [];
  const original = sequelize.query.bind(sequelize) as (sql: unknown, options: unknown) => Promise<unknown>;
  const query = vi.spyOn(sequelize, "query").mockImplementation(((sql: unknown, options: unknown) => {
    statements.push({ sql: String(sql), bind: (options as { bind?: Record<string, unknown> })?.bind ?? {} });
    return original(sql, options);
  }) as typeof sequelize.query);
  try {
    await run();
  } finally {
    query.mockRestore();
  }
  return statements;
}
