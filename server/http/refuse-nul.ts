import type { RequestHandler } from 'express';
import { ValidationError } from './errors';

const NUL = '\u0000';

/** The dotted path of the first string holding a NUL, or null. Walks at most the parsed body (≤ 200 kB). */
function findNul(value: unknown, path: string, depth = 0): string | null {
  if (typeof value === 'string') return value.includes(NUL) ? path || 'body' : null;
  if (depth > 32 || typeof value !== 'object' || value === null) return null;
  for (const [key, inner] of Object.entries(value)) {
    if (key.includes(NUL)) return path ? `${path}.${key}` : key;
    const found = findNul(inner, path ? `${path}.${key}` : key, depth + 1);
    if (found) return found;
  }
  return null;
}

/**
 * PostgreSQL text cannot hold a NUL character, and nobody types one: a request carrying one in its
 * path, query or JSON body is refused with 400 naming the field, before any handler stores it.
 */
export const refuseNul: RequestHandler = (req, _res, next) => {
  let path: string;
  try {
    path = decodeURIComponent(req.path);
  } catch {
    path = req.path;
  }
  const field = path.includes(NUL) ? 'path' : (findNul(req.query, '') ?? findNul(req.body, ''));
  if (field) {
    throw new ValidationError('Remove the invisible NUL character from your text; it cannot be stored.', {
      [field]: 'Remove the invisible NUL character from this text.',
    });
  }
  next();
};
