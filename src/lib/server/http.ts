import type { APIContext } from 'astro';
import { randomUUID } from 'node:crypto';
import type { ZodType, ZodError } from 'zod';

/** Error codes the JSON API answers with, one per HTTP status we use. */
export type ErrorCode =
  | 'invalid_request'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'stale_version'
  | 'too_many_attempts'
  | 'payload_too_large'
  | 'unsupported_media_type'
  | 'internal';

/**
 * An error meant for the client: thrown anywhere below an endpoint and turned into the JSON error
 * body `{"error": {"code", "message", "fields"?}}` by `handle()`.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) =>
  new HttpError(400, 'invalid_request', message, fields);
export const notFound = (what = 'Record') => new HttpError(404, 'not_found', `${what} not found`);
export const conflict = (message: string, code: ErrorCode = 'conflict') => new HttpError(409, code, message);

/** A JSON response with the given status. */
export function json(body: unknown, status = 200, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store', ...headers },
  });
}

/** Flattens zod issues into `{ "a.b": "message" }`, the first message per field. */
export function zodFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

/** Validates a value against a schema or throws a 400 that names the fields. */
export function parseWith<T>(schema: ZodType<T>, value: unknown, what = 'request'): T {
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = zodFields(result.error);
    const names = Object.keys(fields).filter((k) => k !== '_');
    const message = names.length ? `Invalid ${what}: check ${names.join(', ')}` : `Invalid ${what}: ${fields._}`;
    throw badRequest(message, fields);
  }
  return result.data;
}

/** Reads and validates a JSON body; a missing or malformed body is a 400, never a 500. */
export async function readJson<T>(request: Request, schema: ZodType<T>): Promise<T> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.includes('application/json')) {
    throw badRequest('Send the body as application/json');
  }
  let body: unknown;
  try {
    body = await request.json();
  } catch {
    throw badRequest('The body is not valid JSON');
  }
  return parseWith(schema, body, 'body');
}

/** Validates the URL's query string against a schema. */
export function readQuery<T>(url: URL, schema: ZodType<T>): T {
  return parseWith(schema, Object.fromEntries(url.searchParams), 'query');
}

interface DriverError {
  code?: string;
  errno?: number;
  sqlMessage?: string;
}

/**
 * Turns MariaDB's error codes into client errors, in one place: a duplicate key or a foreign-key
 * conflict is a 409 with a plain message, not a 500.
 */
export function translateDriverError(error: unknown): HttpError | null {
  const e = error as DriverError;
  switch (e?.code) {
    case 'ER_DUP_ENTRY':
      return conflict('A record with the same unique value already exists');
    case 'ER_NO_REFERENCED_ROW':
    case 'ER_NO_REFERENCED_ROW_2':
      return conflict('A referenced record does not exist');
    case 'ER_ROW_IS_REFERENCED':
    case 'ER_ROW_IS_REFERENCED_2':
      return conflict('The record is still in use by other records');
    case 'ER_DATA_TOO_LONG':
    case 'ER_TRUNCATED_WRONG_VALUE':
    case 'ER_WARN_DATA_OUT_OF_RANGE':
      return badRequest('A value is too long or out of range');
    default:
      return null;
  }
}

/** Turns any thrown error into a response: HttpError and driver errors as JSON, the rest as 500. */
export function errorResponse(error: unknown): Response {
  if (error instanceof HttpError) {
    const body: { code: ErrorCode; message: string; fields?: Record<string, string> } = {
      code: error.code,
      message: error.message,
    };
    if (error.fields) body.fields = error.fields;
    return json({ error: body }, error.status);
  }
  const translated = translateDriverError(error);
  if (translated) return errorResponse(translated);
  const logId = randomUUID();
  console.error(`[${logId}]`, error);
  return json({ error: { code: 'internal', message: `Something went wrong (log id ${logId})` } }, 500);
}

/** Wraps an endpoint so that every error becomes a JSON response. */
export function handle(fn: (ctx: APIContext) => Promise<Response> | Response) {
  return async (ctx: APIContext): Promise<Response> => {
    try {
      return await fn(ctx);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** Parses a positive integer route parameter or throws 404 (a malformed id names no record). */
export function idParam(value: string | undefined, what = 'Record'): number {
  if (!value || !/^[1-9]\d{0,9}$/.test(value)) throw notFound(what);
  return Number(value);
}
