import type { z } from 'zod';
import { readJson, readQuery } from '../server/http.ts';

/**
 * readJson/readQuery typed by the schema's output, for schemas whose input differs from their output
 * (preprocessed blanks, coerced numbers, defaults): the handler sees the parsed, converted value.
 */
export const readBody = <S extends z.ZodTypeAny>(request: Request, schema: S): Promise<z.output<S>> => readJson(request, schema as z.ZodType<z.output<S>>);
export const readParams = <S extends z.ZodTypeAny>(url: URL, schema: S): z.output<S> => readQuery(url, schema as z.ZodType<z.output<S>>);
