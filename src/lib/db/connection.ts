import knexFactory, { type Knex } from 'knex';

/** What a query module runs on: the app's knex or the transaction of a multi-step write. */
export type Db = Knex | Knex.Transaction;

/**
 * knex settings for a MariaDB URL. Times travel as UTC (`timezone: 'Z'`), DATE columns come back as
 * 'YYYY-MM-DD' strings (a plan day is a calendar day, not an instant), and DECIMAL as numbers.
 */
export function knexConfig(databaseUrl: string, pool = { min: 0, max: 10 }): Knex.Config {
  const url = new URL(databaseUrl);
  return {
    client: 'mysql2',
    connection: {
      host: url.hostname,
      port: Number(url.port || 3306),
      user: decodeURIComponent(url.username),
      password: decodeURIComponent(url.password),
      database: url.pathname.replace(/^\//, ''),
      timezone: 'Z',
      // mysql2 takes a list of column types here; knex's typing only knows the boolean form.
      dateStrings: ['DATE'] as unknown as boolean,
      decimalNumbers: true,
      charset: 'utf8mb4',
      supportBigNumbers: true,
    },
    pool,
    migrations: { tableName: 'knex_migrations', extension: 'ts', loadExtensions: ['.ts'] },
  };
}

/** A new knex instance for a MariaDB URL; the caller destroys it. */
export function createKnex(databaseUrl: string, pool?: { min: number; max: number }): Knex {
  return knexFactory(knexConfig(databaseUrl, pool));
}
