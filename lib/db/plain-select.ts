import 'server-only';
import type { Client } from 'pg';
import { db } from './index';

type ConnectionManager = {
  getConnection(options: { type: 'SELECT' }): Promise<Client>;
  releaseConnection(connection: Client): void;
};

/**
 * A read-only SELECT with positional parameters ($1, $2, …) on a connection of Sequelize's own pool, answered as
 * plain rows: what `sequelize.query(sql, { bind, type: QueryTypes.SELECT })` answers for a query without a
 * model, without the machinery around it (a query object with a uuid, bind formatting, retry, hooks, logging
 * and result handling: about a third of each query's CPU on the hot paths). The connection is Sequelize's, so
 * its type parsers are the same (timestamptz as Date, json parsed). Used by the session look-up and the sheet
 * reads that every signed-in request or sheet page makes (DEVELOPERS.md, "Fourth round"). Strings in `bind`
 * must not contain NUL (Sequelize would escape it; ids and names here are checked before).
 */
export async function plainSelect<Row>(sql: string, bind: readonly unknown[]): Promise<Row[]> {
  const manager = db().connectionManager as unknown as ConnectionManager;
  const connection = await manager.getConnection({ type: 'SELECT' });
  try {
    const result = await connection.query(sql, bind as unknown[]);
    return result.rows as Row[];
  } finally {
    manager.releaseConnection(connection);
  }
}
