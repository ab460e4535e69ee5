import type { Model, ModelStatic } from 'sequelize';

const lists = new Map<string, string>();

/**
 * Every column of `model` read from the table aliased `table`, each named `prefix` + its attribute, so a
 * hand-written query's row builds the instance as findByPk would (`Model.build(row, { raw: true })`).
 * Built once per model, alias and prefix, on first use: the models are initialised at start-up.
 */
export function modelColumns(model: ModelStatic<Model>, table: string, prefix = ''): string {
  const key = `${model.name}\u0000${table}\u0000${prefix}`;
  let list = lists.get(key);
  if (list === undefined) {
    list = Object.entries(model.getAttributes())
      .map(([name, a]) => `${table}."${a.field ?? name}" AS "${prefix}${name}"`)
      .join(', ');
    lists.set(key, list);
  }
  return list;
}

/** A model instance built from a hand-written query's row, as findByPk would have built it. */
export function buildFromRow<M extends Model>(model: ModelStatic<M>, row: Record<string, unknown>): M {
  return model.build(row as never, { isNewRecord: false, raw: true });
}

/**
 * A statement whose text names a model's columns, built on first use (the models are initialised at
 * start-up, after the modules load) and then kept: a hot route sends it on every request.
 */
export function sqlOnce(build: () => string): () => string {
  let sql: string | undefined;
  return () => (sql ??= build());
}

/** Someone named beside a row, as the answers show a person. */
export interface PersonRef {
  id: number;
  displayName: string;
}

/**
 * A row read with a person's `"<prefix>.id"` and `"<prefix>.displayName"` beside its own columns (a LEFT
 * JOIN of users): the person (null when there is none) and the row's own columns apart.
 */
export function personBeside(
  row: Record<string, unknown>,
  prefix: string,
): { person: PersonRef | null; values: Record<string, unknown> } {
  const { [`${prefix}.id`]: id, [`${prefix}.displayName`]: displayName, ...values } = row;
  return { person: id == null ? null : { id: id as number, displayName: displayName as string }, values };
}
