import type { Knex } from 'knex';
import type { Page } from './list-query.ts';

/**
 * Runs a filtered query twice: once as COUNT(*) for the total and once for one page with
 * LIMIT/OFFSET, so a table of 10,000 rows moves only a page over the wire. The caller's query must
 * not have its columns or order set yet; `select` and `order` add them to the page query only.
 */
export async function pageOf<T>(
  filtered: Knex.QueryBuilder,
  page: number,
  pageSize: number,
  select: (q: Knex.QueryBuilder) => Knex.QueryBuilder,
  map: (row: any) => T,
): Promise<Page<T>> {
  const [countRow] = await filtered.clone().clearSelect().clearOrder().count({ n: '*' });
  const total = Number((countRow as { n: number | string } | undefined)?.n ?? 0);
  const rows = await select(filtered.clone()).limit(pageSize).offset((page - 1) * pageSize);
  return { items: (rows as unknown[]).map(map), total, page, pageSize };
}

/** A DATETIME from the driver as an ISO string (or null). */
export const isoOrNull = (v: Date | string | null | undefined): string | null => (v == null ? null : v instanceof Date ? v.toISOString() : new Date(v).toISOString());
