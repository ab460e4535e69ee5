import { z } from 'zod';

/** Row ids are PostgreSQL `integer`s: nothing at or above 2^31 can exist. */
export const MAX_ID = 2_147_483_647;

/** The message of an id too large to exist; the server answers such a path with 404. */
export const ID_TOO_LARGE = 'There is nothing with that id.';

/**
 * An id in a URL path or query (text, coerced to a number). An id too large to exist fails with
 * `too_big`, which the server turns into 404 for a path, like any other id that does not exist.
 */
export const idParam = z.coerce
  .number({ error: 'Expected a number.' })
  .int('Expected a whole-number id.')
  .positive('Expected a positive id.')
  .max(MAX_ID, ID_TOO_LARGE);

/** An id in a JSON body or socket payload: a number already, never text. */
export const bodyId = (message = 'Expected a numeric id.') =>
  z.number({ error: message }).int('Expected a whole-number id.').positive('Expected a positive id.').max(MAX_ID, ID_TOO_LARGE);
