import { parseWith, type Parsed } from '@platesmith/schema';
import type { FastifySchemaCompiler } from 'fastify';
import type { z } from 'zod';
import { RequestInvalid } from './errors.js';

/** Schemas whose parse is not a plain safeParse (e.g. the check body that dispatches on a key). */
const PARSERS = new WeakMap<object, (data: unknown) => Parsed<unknown>>();

export function withParser<S extends z.ZodType>(schema: S, parse: (data: unknown) => Parsed<unknown>): S {
  PARSERS.set(schema, parse);
  return schema;
}

/**
 * Route validation with the zod schemas through parseWith: the issues become a RequestInvalid
 * (400 when any issue is of shape, 422 when only values are wrong), each naming its field.
 */
export const zodValidator: FastifySchemaCompiler<z.ZodType> = ({ schema }) => {
  const parse = PARSERS.get(schema) ?? ((d: unknown) => parseWith(schema, d));
  return (data: unknown) => {
    const r = parse(data);
    return r.ok ? { value: r.value } : { error: new RequestInvalid(r.issues) };
  };
};
