import type { Request, RequestHandler, Response } from 'express';
import type { Sequelize, Transaction } from 'sequelize';
import type { z, ZodError, ZodType } from 'zod';
import { zodFields } from '@shared/schemas/errors';
import { ID_TOO_LARGE } from '@shared/schemas/ids';
import { NotFoundError, ValidationError } from './errors';

type Part = 'params' | 'query' | 'body';
/** The parsed type of an optional schema; `undefined` where the route declares none. */
type Out<S> = S extends ZodType ? z.output<S> : undefined;

export interface RouteSpec<P, Q, B, A> {
  params?: P;
  query?: Q;
  body?: B;
  /**
   * Decides whether the caller may use the route, once params and query are parsed and before the
   * body is: an outsider is refused (403/404) before anything they sent is read as data. What it
   * returns (the swap, the block, the membership it read) reaches the handler as `access`.
   */
  authorize?: (req: Request, input: { params: Out<P>; query: Out<Q> }) => A | Promise<A>;
  /** Middleware that reads a multipart body (photos), run after `authorize` and before `body` is parsed. */
  receive?: RequestHandler;
}

export interface RouteInput<P, Q, B, A> {
  params: Out<P>;
  query: Out<Q>;
  body: Out<B>;
  access: Awaited<A>;
}

/**
 * A path naming an id too large to exist (at or above 2^31) is a path to nothing: 404, as for any
 * other id that does not exist, never a database error.
 */
function assertPathIdsExist(part: Part, error: ZodError) {
  if (part === 'params' && error.issues.some((issue) => issue.message === ID_TOO_LARGE)) throw new NotFoundError(ID_TOO_LARGE);
}

/**
 * Parses the named parts of the request with their schemas; every field that fails is reported in
 * one validation error. The parsed values replace the raw ones on `req` as well.
 */
function parse(req: Request, schemas: Partial<Record<Part, ZodType>>, parts: readonly Part[]): Record<Part, unknown> {
  const fields: Record<string, string> = {};
  const parsed: Record<Part, unknown> = { params: undefined, query: undefined, body: undefined };
  for (const part of parts) {
    const schema = schemas[part];
    if (!schema) continue;
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) {
      assertPathIdsExist(part, result.error);
      Object.assign(fields, zodFields(result.error));
      continue;
    }
    parsed[part] = result.data;
    // Express 5 makes req.query a getter; redefine it so later middleware sees the parsed value.
    Object.defineProperty(req, part, { value: result.data, writable: true, configurable: true, enumerable: true });
  }
  const messages = Object.values(fields);
  if (messages.length) throw new ValidationError(messages.length === 1 ? messages[0]! : 'Some fields need another look.', fields);
  return parsed;
}

/** Runs a middleware (a rate limiter, multer) inside a handler; its `next(error)` becomes a rejection. */
export function runMiddleware(middleware: RequestHandler, req: Request, res: Response): Promise<void> {
  return new Promise((resolve, reject) => {
    void middleware(req, res, (error?: unknown) => (error ? reject(error) : resolve()));
  });
}

/**
 * A route handler whose `params`, `query` and `body` are parsed with their shared zod schemas and
 * typed from them, the HTTP counterpart of the socket side's `handle()`. Order: params and query,
 * then `authorize`, then `receive`, then the body; a route without `authorize` parses all three at
 * once, so every bad field is named in one answer.
 */
export function route<
  P extends ZodType | undefined = undefined,
  Q extends ZodType | undefined = undefined,
  B extends ZodType | undefined = undefined,
  A = undefined,
>(spec: RouteSpec<P, Q, B, A>, handler: (input: RouteInput<P, Q, B, A>, req: Request, res: Response) => unknown): RequestHandler {
  const schemas = { params: spec.params, query: spec.query, body: spec.body } as Partial<Record<Part, ZodType>>;
  const early = spec.authorize || spec.receive;
  return async (req, res) => {
    const parsed = parse(req, schemas, early ? ['params', 'query'] : ['params', 'query', 'body']);
    const input = { params: parsed.params as Out<P>, query: parsed.query as Out<Q> };
    const access = spec.authorize ? await spec.authorize(req, input) : undefined;
    if (spec.receive) await runMiddleware(spec.receive, req, res);
    const body = early ? parse(req, schemas, ['body']).body : parsed.body;
    await handler({ ...input, body: body as Out<B>, access: access as Awaited<A> }, req, res);
  };
}

/** What a handler in a transaction answers; it is sent, and `after` runs, once the transaction has committed. */
export interface Reply<T = unknown> {
  status?: number;
  body: T;
  headers?: Record<string, string>;
  /** `body` serialised already (JSON.stringify), sent as it is instead of serialised again. */
  json?: string;
  /** Work for after the commit (domain events). */
  after?: () => void;
}

export interface TransactionRouteSpec<P, Q, B, A> extends Omit<RouteSpec<P, Q, B, A>, 'authorize' | 'receive'> {
  /** Decides access inside the transaction, so it can read and lock what the handler then changes. */
  authorize: (req: Request, input: { params: Out<P>; query: Out<Q>; transaction: Transaction }) => A | Promise<A>;
  /**
   * Turns a failed transaction into an answer after its rollback (a repeated request answered as
   * the first time); rethrows anything it does not handle.
   */
  recover?: (error: unknown) => Promise<Reply>;
}

/** Sends a handler's `Reply`: its `after` work runs first, as it does once a transaction has committed. */
export function sendReply(res: Response, reply: Reply) {
  reply.after?.();
  if (reply.headers) res.set(reply.headers);
  res.status(reply.status ?? 200);
  if (reply.json === undefined) res.json(reply.body);
  else res.type('json').send(reply.json);
}

/**
 * A route whose policy check and change run in one transaction: `authorize` reads (and may lock) the
 * row the handler changes and hands it over, so the request reads it once; order as in `route`. The
 * handler returns its answer instead of writing it, so nothing is sent before the commit succeeds.
 */
export function transactionRoute<
  P extends ZodType | undefined = undefined,
  Q extends ZodType | undefined = undefined,
  B extends ZodType | undefined = undefined,
  A = undefined,
>(
  sequelize: Sequelize,
  spec: TransactionRouteSpec<P, Q, B, A>,
  handler: (input: RouteInput<P, Q, B, A> & { transaction: Transaction }, req: Request) => Promise<Reply>,
): RequestHandler {
  const schemas = { params: spec.params, query: spec.query, body: spec.body } as Partial<Record<Part, ZodType>>;
  return async (req, res) => {
    const parsed = parse(req, schemas, ['params', 'query']);
    const input = { params: parsed.params as Out<P>, query: parsed.query as Out<Q> };
    let reply: Reply;
    try {
      reply = await sequelize.transaction(async (transaction) => {
        const access = await spec.authorize(req, { ...input, transaction });
        const body = parse(req, schemas, ['body']).body as Out<B>;
        return handler({ ...input, body, access: access as Awaited<A>, transaction }, req);
      });
    } catch (error) {
      if (!spec.recover) throw error;
      reply = await spec.recover(error);
    }
    sendReply(res, reply);
  };
}
