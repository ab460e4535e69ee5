/**
 * Payments routes. The webhook router is mounted before the JSON parser, the session and the CSRF
 * check: the service posts raw, signed bodies with no session and no CSRF header.
 */
import express, { Router, type Request } from 'express';
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
import { route } from '../http/route';
import { currentUser, requireUser } from '../auth/require-user';
import { Guild } from '../db/models';
import { csv, csvWallTime, slug } from '../exports/exports.service';
import type { AppDeps } from '../deps';
import { canPayGuild, canPaySwap, canTreasure } from './payments.policy';
import * as payments from './payments.service';
import { refundById } from './payments.refunds';
import { handlePaymentEvent } from './payments.webhook';

/** POST /api/payments/webhook: raw body, signature header, no session, no CSRF header. */
export function paymentsWebhookRouter(deps: AppDeps) {
  const router = Router();
  router.post('/payments/webhook', express.raw({ type: () => true, limit: '512kb' }), async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    res.json(await handlePaymentEvent(deps, body, req.get('stripe-signature') ?? undefined));
  });
  return router;
}

function paymentsCsv(guildName: string, dto: GuildPaymentsDto, timeZone: string) {
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
    csvWallTime(p.createdAt, timeZone),
    p.displayName,
    paymentKindLabels[p.kind],
    p.swapTitle ?? '',
    p.year ?? '',
    formatMoney(p.amount, p.currency).replace(/[^\d.,-]/g, ''),
    p.currency.toUpperCase(),
    p.status,
    paymentStatusLabels[p.status],
    csvWallTime(p.paidAt, timeZone),
    csvWallTime(p.refundedAt, timeZone),
    p.refundError ?? p.statusReason ?? '',
  ]);
  return { fileName: `${slug(guildName)}-payments.csv`, body: csv(header, rows) };
}

export function paymentsRouter(deps: AppDeps) {
  const router = Router();
  const me = (req: Request) => currentUser(req).id;

  router.get(
    '/me/payments',
    requireUser,
    route({ query: myPaymentsQuerySchema }, async ({ query }, req, res) => {
      res.json(await payments.myPayments(deps, me(req), query.session));
    }),
  );

  router.get(
    '/swaps/:swapId/fees',
    requireUser,
    route(
      { params: swapParamsSchema, authorize: (req, { params }) => canPaySwap(deps, me(req), params.swapId) },
      async ({ params, access }, req, res) => {
        res.json(await payments.swapFees(deps, params.swapId, me(req), access.canManage));
      },
    ),
  );

  router.post(
    '/swaps/:swapId/checkout',
    requireUser,
    route(
      {
        params: swapParamsSchema,
        body: swapCheckoutSchema,
        authorize: (req, { params }) => canPaySwap(deps, me(req), params.swapId),
      },
      async ({ params, body }, req, res) => {
        res.json(await payments.startSwapCheckout(deps, params.swapId, me(req), body.kinds));
      },
    ),
  );

  router.get(
    '/guilds/:guildId/dues',
    requireUser,
    route(
      { params: guildParamsSchema, authorize: (req, { params }) => canPayGuild(deps, me(req), params.guildId) },
      async ({ params, access }, req, res) => {
        res.json(await payments.guildDues(deps, params.guildId, me(req), access.isTreasurer));
      },
    ),
  );

  router.post(
    '/guilds/:guildId/dues/checkout',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        body: duesCheckoutSchema,
        authorize: (req, { params }) => canPayGuild(deps, me(req), params.guildId),
      },
      async ({ params }, req, res) => {
        res.json(await payments.startDuesCheckout(deps, params.guildId, me(req)));
      },
    ),
  );

  router.get(
    '/guilds/:guildId/payments',
    requireUser,
    route(
      {
        params: guildParamsSchema,
        query: guildPaymentsQuerySchema,
        authorize: (req, { params }) => canTreasure(deps, me(req), params.guildId),
      },
      async ({ params, query }, _req, res) => {
        const { format, ...filters } = query;
        const dto = await payments.guildPayments(deps, params.guildId, filters);
        if (format !== 'csv') return void res.json(dto);
        const guild = await Guild.findByPk(params.guildId, { attributes: ['timeZone'] });
        const file = paymentsCsv(dto.guildName, dto, guild?.timeZone ?? 'UTC');
        res
          .status(200)
          .set('Content-Type', 'text/csv; charset=utf-8')
          .set('Content-Disposition', `attachment; filename="${file.fileName}"`)
          .set('Cache-Control', 'no-store')
          .send(file.body);
      },
    ),
  );

  router.post(
    '/guilds/:guildId/payments/:paymentId/refund',
    requireUser,
    route(
      {
        params: guildParamsSchema.extend(paymentParamsSchema.shape),
        authorize: (req, { params }) => canTreasure(deps, me(req), params.guildId),
      },
      async ({ params }, _req, res) => {
        res.json(await refundById(deps, params.guildId, params.paymentId));
      },
    ),
  );

  return router;
}
