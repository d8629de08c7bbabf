import { z } from 'zod';

/** Largest page a table may ask for: keeps one request's work bounded whatever the practice's size. */
export const MAX_PAGE_SIZE = 100;

/**
 * The query string every records table sends: search text, one sort key from the table's own list,
 * direction, page and page size, and whether archived records are shown. Values come in as strings.
 */
export function listQuerySchema<S extends [string, ...string[]]>(sorts: S, defaultSort: S[number]) {
  return z.object({
    q: z.string().trim().max(100, 'Search at most 100 characters').optional().default(''),
    sort: z.enum(sorts).optional().default(defaultSort as never),
    dir: z.enum(['asc', 'desc']).optional().default('asc'),
    page: z.coerce.number().int().min(1).max(100_000).optional().default(1),
    pageSize: z.coerce.number().int().min(5).max(MAX_PAGE_SIZE).optional().default(25),
    archived: z.enum(['exclude', 'include', 'only']).optional().default('exclude'),
  });
}

/** An optional numeric id filter in a query string ("" means none). */
export const idFilter = z.preprocess((v) => (v === '' || v === undefined ? undefined : v), z.coerce.number().int().positive().optional());

/** One page of a table and the total count of matching records (counted once per request). */
export interface Page<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** Escapes LIKE wildcards so a search for "50%" finds that text. */
export function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
