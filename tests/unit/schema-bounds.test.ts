/**
 * Every string a schema accepts has a maximum length, so long input is refused before any pattern
 * or parser reads it. Walks every exported zod schema of the shared contract.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

interface ZodLike {
  _zod: { def: Record<string, unknown> & { type: string } };
}

const isZod = (v: unknown): v is ZodLike => typeof v === 'object' && v !== null && '_zod' in v;

/** Paths of string schemas without a max_length (or exact length) check. */
function unbounded(schema: unknown, where: string, out: string[], seen = new Set<unknown>()): string[] {
  if (!isZod(schema) || seen.has(schema)) return out;
  seen.add(schema);
  const def = schema._zod.def as Record<string, unknown> & { type: string };
  const inner = (key: string, suffix = '') => unbounded(def[key], `${where}${suffix}`, out, seen);
  switch (def.type) {
    case 'string': {
      const checks = (def.checks as ZodLike[] | undefined) ?? [];
      if (!checks.some((c) => ['max_length', 'length_equals'].includes(String(c._zod.def.check)))) out.push(where);
      break;
    }
    case 'object':
      for (const [key, value] of Object.entries(def.shape as Record<string, unknown>))
        unbounded(value, `${where}.${key}`, out, seen);
      inner('catchall', '.*');
      break;
    case 'array':
      inner('element', '[]');
      break;
    case 'tuple':
      (def.items as unknown[]).forEach((item, i) => unbounded(item, `${where}[${i}]`, out, seen));
      inner('rest', '[...]');
      break;
    case 'union':
      (def.options as unknown[]).forEach((option, i) => unbounded(option, `${where}|${i}`, out, seen));
      break;
    case 'intersection':
      inner('left');
      inner('right');
      break;
    case 'pipe': // the input side is what a caller sends
      inner('in');
      break;
    case 'record':
      inner('keyType', '{key}');
      inner('valueType', '{}');
      break;
    case 'lazy':
      unbounded((def.getter as () => unknown)(), where, out, seen);
      break;
    default:
      if ('innerType' in def) inner('innerType');
  }
  return out;
}

const schemaDir = fileURLToPath(new URL('../../shared/schemas/', import.meta.url));
const modules = [
  ...readdirSync(schemaDir)
    .filter((f) => f.endsWith('.ts'))
    .map((f) => `../../shared/schemas/${f}`),
  '../../shared/quilt/schemas.ts',
];

describe('string bounds in the shared schemas', () => {
  it.each(modules)('%s bounds every string it accepts', async (path) => {
    const mod = (await import(path)) as Record<string, unknown>;
    const problems = Object.entries(mod).flatMap(([name, value]) => unbounded(value, name, []));
    expect(problems).toEqual([]);
  });

  it('finds an unbounded string when there is one', async () => {
    const { z } = await import('zod');
    const schema = z.object({ ok: z.string().max(5), loose: z.array(z.union([z.number(), z.string().trim()])) });
    expect(unbounded(schema, 'body', [])).toEqual(['body.loose[]|1']);
  });
});
