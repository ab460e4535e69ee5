/**
 * Payments routes. The webhook router is mounted before the JSON parser, the session and the CSRF
 * check: the service posts raw, signed bodies with no session and no CSRF header.
 */
import express, { Router } from 'express';
import { type z } from 'zod';
import { guildParamsSchema } from '@shared/schemas/guilds';
import { swapParamsSchema } from '@shared/schemas/swaps';
import {
  duesCheckoutSchema,
  formatMoney,
  guildPaymentsQuerySchema,
  myPaymentsQuerySchema,
  paymentKindLabels,
  paymentParamsSchema,
  paymentStatusLabels,
  swapCheckoutSchema,
  type GuildPaymentsDto,
} from '@shared/schemas/payments';
import { validate } from '../http/validate';
import { currentUser, requireUser } from '../auth/require-user';
import { csv, slug } from '../exports/exports.service';
import type { AppDeps } from '../deps';
import { canPayGuild, canPaySwap, canTreasure } from './payments.policy';
import * as payments from './payments.service';
import { handlePaymentEvent } from './payments.webhook';

type GuildParams = z.infer<typeof guildParamsSchema>;
type SwapParams = z.infer<typeof swapParamsSchema>;

/** POST /api/payments/webhook: raw body, signature header, no session, no CSRF header. */
export function paymentsWebhookRouter(deps: AppDeps) {
  const router = Router();
  router.post('/payments/webhook', express.raw({ type: () => true, limit: '512kb' }), async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    res.json(await handlePaymentEvent(deps, body, req.get('stripe-signature') ?? undefined));
  });
  return router;
}

function paymentsCsv(guildName: string, dto: GuildPaymentsDto) {
  const header = [
    'Date',
    'Member',
    'What',
    'Swap',
    'Year',
    'Amount',
    'Currency',
    'Status',
    'Status (words)',
    'Paid at',
    'Refunded at',
    'Note',
  ];
  const rows = dto.payments.map((p) => [
    p.createdAt,
    p.displayName,
    paymentKindLabels[p.kind],
    p.swapTitle ?? '',
    p.year ?? '',
    formatMoney(p.amount, p.currency).replace(/[^\d.,-]/g, ''),
    p.currency.toUpperCase(),
    p.status,
    paymentStatusLabels[p.status],
    p.paidAt ?? '',
    p.refundedAt ?? '',
    p.refundError ?? p.statusReason ?? '',
  ]);
  return { fileName: `${slug(guildName)}-payments.csv`, body: csv(header, rows) };
}

export function paymentsRouter(deps: AppDeps) {
  const router = Router();
  router.use('/payments', requireUser);

  router.get('/me/payments', requireUser, validate({ query: myPaymentsQuerySchema }), async (req, res) => {
    const { session } = req.query as z.infer<typeof myPaymentsQuerySchema>;
    res.json(await payments.myPayments(deps, currentUser(req).id, session));
  });

  router.get('/swaps/:swapId/fees', requireUser, validate({ params: swapParamsSchema }), async (req, res) => {
    const { swapId } = req.params as unknown as SwapParams;
    const user = currentUser(req);
    const { canManage } = await canPaySwap(user.id, swapId);
    res.json(await payments.swapFees(deps, swapId, user.id, canManage));
  });

  router.post(
    '/swaps/:swapId/checkout',
    requireUser,
    validate({ params: swapParamsSchema, body: swapCheckoutSchema }),
    async (req, res) => {
      const { swapId } = req.params as unknown as SwapParams;
      const user = currentUser(req);
      await canPaySwap(user.id, swapId);
      const { kinds } = req.body as z.infer<typeof swapCheckoutSchema>;
      res.json(await payments.startSwapCheckout(deps, swapId, user.id, kinds));
    },
  );

  router.get('/guilds/:guildId/dues', requireUser, validate({ params: guildParamsSchema }), async (req, res) => {
    const { guildId } = req.params as unknown as GuildParams;
    const user = currentUser(req);
    const { isTreasurer } = await canPayGuild(user.id, guildId);
    res.json(await payments.guildDues(deps, guildId, user.id, isTreasurer));
  });

  router.post(
    '/guilds/:guildId/dues/checkout',
    requireUser,
    validate({ params: guildParamsSchema, body: duesCheckoutSchema }),
    async (req, res) => {
      const { guildId } = req.params as unknown as GuildParams;
      const user = currentUser(req);
      await canPayGuild(user.id, guildId);
      res.json(await payments.startDuesCheckout(deps, guildId, user.id));
    },
  );

  router.get(
    '/guilds/:guildId/payments',
    requireUser,
    validate({ params: guildParamsSchema, query: guildPaymentsQuerySchema }),
    async (req, res) => {
      const { guildId } = req.params as unknown as GuildParams;
      await canTreasure(currentUser(req).id, guildId);
      const { format, ...filters } = req.query as z.infer<typeof guildPaymentsQuerySchema>;
      const dto = await payments.guildPayments(deps, guildId, filters);
      if (format !== 'csv') return void res.json(dto);
      const { rows } = await deps.pool.query<{ name: string }>('SELECT name FROM guilds WHERE id = $1', [guildId]);
      const file = paymentsCsv(rows[0]?.name ?? 'guild', dto);
      res
        .status(200)
        .set('Content-Type', 'text/csv; charset=utf-8')
        .set('Content-Disposition', `attachment; filename="${file.fileName}"`)
        .set('Cache-Control', 'no-store')
        .send(file.body);
    },
  );

  router.post(
    '/guilds/:guildId/payments/:paymentId/refund',
    requireUser,
    validate({ params: guildParamsSchema.extend(paymentParamsSchema.shape) }),
    async (req, res) => {
      const { guildId, paymentId } = req.params as unknown as GuildParams & z.infer<typeof paymentParamsSchema>;
      await canTreasure(currentUser(req).id, guildId);
      res.json(await payments.refundById(deps, guildId, paymentId));
    },
  );

  return router;
}
