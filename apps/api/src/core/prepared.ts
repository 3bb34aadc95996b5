import { createHash } from 'node:crypto';

interface Preparable {
  prepare(name: string): { execute(): Promise<unknown> };
}

/** What drizzle's node-postgres statement keeps of the query it hands to pg, named or not. */
interface NodePgStatement {
  queryString: string;
  queryConfig: { name?: string };
  rawQueryConfig: { name?: string };
}

/** The statement name of a query text: the same text always gets the same name, different texts never share one. */
export function statementName(text: string): string {
  return `hb_${createHash('sha1').update(text).digest('base64url')}`;
}

/**
 * Runs a read as a named prepared statement. Every pooled connection then parses and plans that text
 * once and PostgreSQL moves to a cached generic plan after a few runs; for the busiest lists, planning
 * a query cost more than running it. Only for queries whose text comes from a bounded set of shapes
 * (values are parameters), since each connection keeps every statement it has prepared.
 *
 * The name is the digest of the text, known only once drizzle has built it; naming the built statement
 * saves building the query twice.
 */
export function runPrepared<Q extends Preparable>(query: Q): ReturnType<ReturnType<Q['prepare']>['execute']> {
  const prepared = query.prepare('');
  const statement = prepared as unknown as NodePgStatement;
  const name = statementName(statement.queryString);
  statement.queryConfig.name = name;
  statement.rawQueryConfig.name = name;
  return prepared.execute() as ReturnType<ReturnType<Q['prepare']>['execute']>;
}
