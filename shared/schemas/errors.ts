import type { ZodError } from 'zod';

/** The JSON error body every API answer uses. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}

/** Flattens a zod error into `{ "field.path": "message" }`, first message per field. */
export function zodFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}
