import type { RequestHandler } from 'express';
import type { ZodType } from 'zod';
import { ValidationError } from './errors';
import { zodFields } from '@shared/schemas/errors';
import { assertPathIdsExist } from './route';

interface Schemas {
  body?: ZodType;
  query?: ZodType;
  params?: ZodType;
}

/** Parses body, query and params with the shared zod schemas and replaces them with the parsed values. */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const fields: Record<string, string> = {};
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part] ?? {});
      if (!result.success) {
        assertPathIdsExist(part, result.error);
        Object.assign(fields, zodFields(result.error));
        continue;
      }
      // Express 5 makes req.query a getter; redefine it so handlers see the parsed value.
      Object.defineProperty(req, part, { value: result.data, writable: true, configurable: true, enumerable: true });
    }
    if (Object.keys(fields).length) {
      const first = Object.values(fields)[0];
      throw new ValidationError(Object.keys(fields).length === 1 ? first! : 'Some fields need another look.', fields);
    }
    next();
  };
}
