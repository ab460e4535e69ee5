/**
 * A local stand-in for the hosted payments service, so `npm start` and `npm test` need no account and
 * no network. It answers the REST calls the official SDK makes for hosted checkout (create, read and
 * expire a checkout session; create and read a refund; register a webhook endpoint), serves its own
 * plain checkout page with Pay and Decline, and delivers events to every registered endpoint signed
 * the way the real service signs them (`Stripe-Signature: t=…,v1=HMAC-SHA256(secret, "t.payload")`).
 * It moves no money and keeps everything in memory.
 */
import { createHmac, randomBytes } from 'node:crypto';
import type { Server } from 'node:http';
import express, { type Request, type Response } from 'express';

type Meta = Record<string, string>;

interface LineItem {
  name: string;
  unitAmount: number;
  quantity: number;
}

interface CheckoutSession {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_total: number;
  currency: string;
  client_reference_id: string | null;
  customer_email: string | null;
  metadata: Meta;
  payment_intent: string | null;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  created: number;
  expires_at: number;
  livemode: false;
  lineItems: LineItem[];
  intentMetadata: Meta;
}

interface PaymentIntent {
  id: string;
  object: 'payment_intent';
  amount: number;
  amount_received: number;
  currency: string;
  status: 'succeeded' | 'requires_payment_method';
  metadata: Meta;
  last_payment_error: { code: string; message: string } | null;
  created: number;
  livemode: false;
  refunded: number;
}

interface Refund {
  id: string;
  object: 'refund';
  amount: number;
  currency: string;
  payment_intent: string;
  status: 'pending' | 'succeeded' | 'failed';
  metadata: Meta;
  created: number;
}

interface Endpoint {
  id: string;
  object: 'webhook_endpoint';
  url: string;
  secret: string;
  enabled_events: string[];
  status: 'enabled';
  created: number;
}

export interface DeliveredEvent {
  id: string;
  type: string;
  endpoint: string;
  status: number | null;
  attempts: number;
}

export interface PaymentsFakeOptions {
  port?: number;
  /** Endpoints known from the start (npm start registers the app's own). */
  endpoints?: { url: string; secret: string }[];
  /** Seconds after which an unpaid checkout session expires (the real service allows 30 min–24 h). */
  sessionSeconds?: number;
  log?: (msg: string) => void;
}

export interface PaymentsFake {
  port: number;
  url: string;
  /** Every delivery attempt's outcome, newest last (tests read it). */
  deliveries: DeliveredEvent[];
  stop(): Promise<void>;
}

const now = () => Math.floor(Date.now() / 1000);
const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`;

/** The header the real service sends: a timestamp and an HMAC-SHA256 of "timestamp.payload". */
export function signPayload(payload: string, secret: string, timestamp = now()): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

function apiError(res: Response, status: number, message: string, param?: string) {
  res.status(status).json({ error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) } });
}

function metadataOf(value: unknown): Meta {
  if (!value || typeof value !== 'object') return {};
  return Object.fromEntries(Object.entries(value as Record<string, unknown>).filter(([, v]) => typeof v === 'string')) as Meta;
}

function escapeHtml(text: string) {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function money(amount: number, currency: string) {
  const code = currency.toUpperCase();
  const digits = new Intl.NumberFormat('en', { style: 'currency', currency: code }).resolvedOptions().maximumFractionDigits ?? 2;
  return new Intl.NumberFormat('en', { style: 'currency', currency: code }).format(amount / 10 ** digits);
}

function publicSession(s: CheckoutSession) {
  const { lineItems: _lines, intentMetadata: _meta, ...rest } = s;
  return rest;
}

export async function startPaymentsFake(opts: PaymentsFakeOptions = {}): Promise<PaymentsFake> {
  const log = opts.log ?? (() => undefined);
  const sessions = new Map<string, CheckoutSession>();
  const intents = new Map<string, PaymentIntent>();
  const refunds = new Map<string, Refund>();
  const endpoints = new Map<string, Endpoint>();
  const idempotent = new Map<string, { status: number; body: unknown }>();
  const deliveries: DeliveredEvent[] = [];
  let base = '';
  // One delivery chain per endpoint, so each endpoint sees events in the order they happened.
  const chains = new Map<string, Promise<void>>();

  for (const e of opts.endpoints ?? []) {
    const id = newId('we');
    endpoints.set(id, {
      id,
      object: 'webhook_endpoint',
      url: e.url,
      secret: e.secret,
      enabled_events: ['*'],
      status: 'enabled',
      created: now(),
    });
  }

  async function deliver(endpoint: Endpoint, event: { id: string; type: string }, payload: string) {
    const record: DeliveredEvent = { id: event.id, type: event.type, endpoint: endpoint.url, status: null, attempts: 0 };
    deliveries.push(record);
    for (const waitMs of [0, 250, 1000, 3000, 8000]) {
      if (waitMs) await new Promise((r) => setTimeout(r, waitMs));
      record.attempts += 1;
      try {
        const answer = await fetch(endpoint.url, {
          method: 'POST',
          headers: {
            'content-type': 'application/json; charset=utf-8',
            'stripe-signature': signPayload(payload, endpoint.secret),
            'user-agent': 'blockpost-payments-fake',
          },
          body: payload,
          signal: AbortSignal.timeout(10_000),
        });
        record.status = answer.status;
        await answer.arrayBuffer();
        if (answer.ok) return;
      } catch {
        record.status = null;
      }
    }
    log(`webhook ${event.type} to ${endpoint.url} failed after ${record.attempts} attempts`);
  }

  function emit(type: string, object: unknown) {
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: '2026-10-28.endive',
      created: now(),
      type,
      livemode: false,
      pending_webhooks: endpoints.size,
      request: { id: null, idempotency_key: null },
      data: { object },
    };
    const payload = JSON.stringify(event, null, 2);
    for (const endpoint of endpoints.values()) {
      if (!endpoint.enabled_events.includes('*') && !endpoint.enabled_events.includes(type)) continue;
      const previous = chains.get(endpoint.id) ?? Promise.resolve();
      chains.set(
        endpoint.id,
        previous.then(() => deliver(endpoint, event, payload)),
      );
    }
  }

  function expire(session: CheckoutSession) {
    if (session.status !== 'open') return;
    session.status = 'expired';
    session.url = null;
    emit('checkout.session.expired', publicSession(session));
  }

  const app = express();
  app.disable('x-powered-by');
  const api = express.Router();
  api.use(express.urlencoded({ extended: true, limit: '100kb' }));
  api.use((req, res, next) => {
    const auth = req.get('authorization') ?? '';
    if (!/^Bearer sk_test_\w{1,200}$/.test(auth))
      return apiError(res, 401, 'Invalid API key provided: the local fake takes any key starting with sk_test_.');
    // The SDK retries POSTs with the same Idempotency-Key; answer a repeat with the first answer.
    const key = req.method === 'POST' ? req.get('idempotency-key') : undefined;
    if (key && idempotent.has(key)) {
      const saved = idempotent.get(key)!;
      return res.status(saved.status).json(saved.body);
    }
    if (key) {
      const json = res.json.bind(res);
      res.json = (body: unknown) => {
        idempotent.set(key, { status: res.statusCode, body });
        return json(body);
      };
    }
    next();
  });

  api.post('/checkout/sessions', (req, res) => {
    const body = req.body as Record<string, unknown>;
    if (body.mode !== 'payment') return apiError(res, 400, 'The local fake supports mode=payment only.', 'mode');
    if (typeof body.success_url !== 'string' || !/^https?:\/\//.test(body.success_url))
      return apiError(res, 400, 'Missing required param: success_url.', 'success_url');
    const rawLines = Array.isArray(body.line_items) ? (body.line_items as Record<string, unknown>[]) : [];
    if (rawLines.length === 0) return apiError(res, 400, 'Missing required param: line_items.', 'line_items');
    const lines: LineItem[] = [];
    let currency = '';
    for (const [i, raw] of rawLines.entries()) {
      const price = (raw.price_data ?? {}) as Record<string, unknown>;
      const product = (price.product_data ?? {}) as Record<string, unknown>;
      const unitAmount = Number(price.unit_amount);
      const quantity = Number(raw.quantity ?? 1);
      if (!Number.isInteger(unitAmount) || unitAmount <= 0)
        return apiError(
          res,
          400,
          `Invalid integer: line_items[${i}][price_data][unit_amount].`,
          `line_items[${i}][price_data][unit_amount]`,
        );
      if (!Number.isInteger(quantity) || quantity < 1)
        return apiError(res, 400, `Invalid integer: line_items[${i}][quantity].`, `line_items[${i}][quantity]`);
      if (typeof price.currency !== 'string')
        return apiError(res, 400, `Missing required param: line_items[${i}][price_data][currency].`);
      if (currency && price.currency !== currency) return apiError(res, 400, 'All line items must use the same currency.');
      currency = price.currency;
      lines.push({ name: typeof product.name === 'string' ? product.name : 'Item', unitAmount, quantity });
    }
    const id = newId('cs');
    const session: CheckoutSession = {
      id,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: lines.reduce((sum, l) => sum + l.unitAmount * l.quantity, 0),
      currency,
      client_reference_id: typeof body.client_reference_id === 'string' ? body.client_reference_id : null,
      customer_email: typeof body.customer_email === 'string' ? body.customer_email : null,
      metadata: metadataOf(body.metadata),
      payment_intent: null,
      success_url: body.success_url,
      cancel_url: typeof body.cancel_url === 'string' ? body.cancel_url : null,
      url: `${base}/checkout/${id}`,
      created: now(),
      expires_at: Number(body.expires_at) || now() + (opts.sessionSeconds ?? 24 * 3600),
      livemode: false,
      lineItems: lines,
      intentMetadata: metadataOf((body.payment_intent_data as Record<string, unknown> | undefined)?.metadata),
    };
    sessions.set(id, session);
    res.json(publicSession(session));
  });

  api.get('/checkout/sessions/:id', (req, res) => {
    const session = sessions.get(req.params.id!);
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`);
    if (session.status === 'open' && session.expires_at <= now()) expire(session);
    res.json(publicSession(session));
  });

  api.post('/checkout/sessions/:id/expire', (req, res) => {
    const session = sessions.get(req.params.id!);
    if (!session) return apiError(res, 404, `No such checkout.session: '${req.params.id}'`);
    if (session.status !== 'open')
      return apiError(res, 400, `Only open checkout sessions can be expired; this one is ${session.status}.`);
    expire(session);
    res.json(publicSession(session));
  });

  api.post('/refunds', (req, res) => {
    const body = req.body as Record<string, unknown>;
    const intent = typeof body.payment_intent === 'string' ? intents.get(body.payment_intent) : undefined;
    if (!intent) return apiError(res, 400, `No such payment_intent: '${String(body.payment_intent)}'`, 'payment_intent');
    if (intent.status !== 'succeeded')
      return apiError(res, 400, 'This payment was never completed, so there is nothing to refund.');
    const left = intent.amount_received - intent.refunded;
    const amount = body.amount === undefined ? left : Number(body.amount);
    if (!Number.isInteger(amount) || amount <= 0) return apiError(res, 400, 'Invalid integer: amount.', 'amount');
    if (amount > left)
      return apiError(
        res,
        400,
        `Refund amount (${amount}) is greater than the unrefunded amount on the payment (${left}).`,
        'amount',
      );
    intent.refunded += amount;
    const refund: Refund = {
      id: newId('re'),
      object: 'refund',
      amount,
      currency: intent.currency,
      payment_intent: intent.id,
      status: 'pending',
      metadata: metadataOf(body.metadata),
      created: now(),
    };
    refunds.set(refund.id, refund);
    emit('refund.created', { ...refund });
    // The real service settles a card refund a little later and says so with refund.updated.
    setTimeout(() => {
      refund.status = 'succeeded';
      emit('refund.updated', { ...refund });
    }, 100).unref();
    res.json(refund);
  });

  api.get('/refunds/:id', (req, res) => {
    const refund = refunds.get(req.params.id!);
    if (!refund) return apiError(res, 404, `No such refund: '${req.params.id}'`);
    res.json(refund);
  });

  api.get('/payment_intents/:id', (req, res) => {
    const intent = intents.get(req.params.id!);
    if (!intent) return apiError(res, 404, `No such payment_intent: '${req.params.id}'`);
    res.json(intent);
  });

  api.post('/webhook_endpoints', (req, res) => {
    const body = req.body as Record<string, unknown>;
    if (typeof body.url !== 'string' || !/^https?:\/\//.test(body.url))
      return apiError(res, 400, 'Missing required param: url.', 'url');
    const events = Array.isArray(body.enabled_events)
      ? (body.enabled_events as unknown[]).filter((e): e is string => typeof e === 'string')
      : [];
    const endpoint: Endpoint = {
      id: newId('we'),
      object: 'webhook_endpoint',
      url: body.url,
      secret: `whsec_${randomBytes(24).toString('hex')}`,
      enabled_events: events.length ? events : ['*'],
      status: 'enabled',
      created: now(),
    };
    endpoints.set(endpoint.id, endpoint);
    res.json(endpoint);
  });

  api.delete('/webhook_endpoints/:id', (req, res) => {
    const existed = endpoints.delete(req.params.id!);
    if (!existed) return apiError(res, 404, `No such webhook_endpoint: '${req.params.id}'`);
    res.json({ id: req.params.id, object: 'webhook_endpoint', deleted: true });
  });

  api.use((req, res) =>
    apiError(
      res,
      404,
      `Unrecognized request URL (${req.method}: ${req.path}). The local fake answers only the calls Blockpost makes.`,
    ),
  );
  app.use('/v1', api);

  // The hosted checkout page, in the fake's own plain look and clearly marked as a test page.
  const page = (title: string, body: string) => `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · local test checkout</title>
<style>
body{font:18px/1.5 system-ui,sans-serif;margin:0;background:#fff;color:#1a1a1a}
main{max-width:34rem;margin:0 auto;padding:1.5rem}
.banner{background:#fff3c4;border:2px solid #8a6d00;padding:.75rem 1rem;border-radius:.5rem}
table{width:100%;border-collapse:collapse;margin:1rem 0}td{padding:.4rem 0;border-bottom:1px solid #ddd}td:last-child{text-align:right}
button,a.button{display:inline-block;min-height:44px;min-width:44px;padding:.6rem 1.2rem;font:inherit;border-radius:.5rem;border:2px solid #1a1a1a;background:#fff;color:#1a1a1a;text-decoration:none;cursor:pointer;margin:.25rem .5rem .25rem 0}
button.pay{background:#1a4d2e;border-color:#1a4d2e;color:#fff}
</style></head><body><main>
<p class="banner" role="note"><strong>Local test checkout.</strong> No money moves and no card is asked for: this page stands in for the hosted payment service while Blockpost runs on this computer.</p>
${body}
</main></body></html>`;

  app.use('/checkout', express.urlencoded({ extended: false, limit: '10kb' }));

  app.get('/checkout/:id', (req, res) => {
    const session = sessions.get(req.params.id!);
    res.set('Cache-Control', 'no-store');
    if (!session) return res.status(404).send(page('Not found', '<h1>This checkout does not exist</h1>'));
    if (session.status === 'open' && session.expires_at <= now()) expire(session);
    if (session.status === 'expired') {
      const back = session.cancel_url
        ? `<p><a class="button" href="${escapeHtml(session.cancel_url)}">Back to Blockpost</a></p>`
        : '';
      return res.send(page('Expired', `<h1>This checkout has expired</h1><p>Start the payment again from Blockpost.</p>${back}`));
    }
    if (session.status === 'complete') {
      return res.send(
        page(
          'Paid',
          `<h1>Already paid</h1><p><a class="button" href="${escapeHtml(session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id))}">Back to Blockpost</a></p>`,
        ),
      );
    }
    const declined =
      req.query.declined === '1'
        ? '<p role="alert"><strong>The test payment was declined.</strong> Nothing was charged. Try again, or go back.</p>'
        : '';
    const rows = session.lineItems
      .map(
        (l) =>
          `<tr><td>${escapeHtml(l.name)}${l.quantity > 1 ? ` × ${l.quantity}` : ''}</td><td>${escapeHtml(money(l.unitAmount * l.quantity, session.currency))}</td></tr>`,
      )
      .join('');
    const back = session.cancel_url ? `<a class="button" href="${escapeHtml(session.cancel_url)}">Back without paying</a>` : '';
    res.send(
      page(
        'Pay',
        `<h1>Pay ${escapeHtml(money(session.amount_total, session.currency))}</h1>${declined}
<table><tbody>${rows}<tr><td><strong>Total</strong></td><td><strong>${escapeHtml(money(session.amount_total, session.currency))}</strong></td></tr></tbody></table>
<form method="post" action="/checkout/${session.id}/pay" style="display:inline"><button class="pay" type="submit">Pay</button></form>
<form method="post" action="/checkout/${session.id}/decline" style="display:inline"><button type="submit">Decline</button></form>
${back}`,
      ),
    );
  });

  /** The session's payment intent, made on the first try to pay (as the real service does). */
  function intentOf(session: CheckoutSession): PaymentIntent {
    const existing = session.payment_intent ? intents.get(session.payment_intent) : undefined;
    if (existing) return existing;
    const intent: PaymentIntent = {
      id: newId('pi'),
      object: 'payment_intent',
      amount: session.amount_total,
      amount_received: 0,
      currency: session.currency,
      status: 'requires_payment_method',
      metadata: session.intentMetadata,
      last_payment_error: null,
      created: now(),
      livemode: false,
      refunded: 0,
    };
    intents.set(intent.id, intent);
    session.payment_intent = intent.id;
    return intent;
  }

  app.post('/checkout/:id/pay', (req, res) => {
    const session = sessions.get(req.params.id!);
    if (!session || session.status !== 'open') return res.redirect(303, `/checkout/${encodeURIComponent(req.params.id!)}`);
    const intent = intentOf(session);
    intent.status = 'succeeded';
    intent.amount_received = intent.amount;
    intent.last_payment_error = null;
    session.payment_intent = intent.id;
    session.status = 'complete';
    session.payment_status = 'paid';
    session.url = null;
    emit('payment_intent.succeeded', { ...intent });
    emit('checkout.session.completed', publicSession(session));
    res.redirect(303, session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id));
  });

  app.post('/checkout/:id/decline', (req, res) => {
    const session = sessions.get(req.params.id!);
    if (!session || session.status !== 'open') return res.redirect(303, `/checkout/${encodeURIComponent(req.params.id!)}`);
    const intent = intentOf(session);
    intent.last_payment_error = { code: 'card_declined', message: 'Your card was declined.' };
    emit('payment_intent.payment_failed', { ...intent });
    res.redirect(303, `/checkout/${session.id}?declined=1`);
  });

  app.get('/_fake/deliveries', (_req, res) => res.json(deliveries));
  app.get('/healthz', (_req, res: Response) => res.json({ ok: true }));
  app.use((_req: Request, res: Response) => res.status(404).send(page('Not found', '<h1>Nothing here</h1>')));

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(opts.port ?? 0, '127.0.0.1', () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  base = `http://127.0.0.1:${port}`;
  // Sessions left open past their time expire, as they would on the real service.
  const sweeper = setInterval(() => {
    for (const s of sessions.values()) if (s.status === 'open' && s.expires_at <= now()) expire(s);
  }, 5_000);
  sweeper.unref();

  return {
    port,
    url: base,
    deliveries,
    async stop() {
      clearInterval(sweeper);
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
