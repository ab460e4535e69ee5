/**
 * Where feature slices plug into the app: their routers (mounted under /api, after the core ones) and
 * their start-up hooks (socket.io, job workers), which run once the HTTP server exists.
 */
import type { Server } from 'node:http';
import type { Router } from 'express';
import type { AppDeps } from './deps';
import type { BuiltApp } from './app';
import { liveStartup } from './live/live.startup';
import { boardLive } from './board/board.socket';
import { chatLive } from './chat/chat.socket';
import { photosRouter } from './uploads/photos.routes';
import { photoStoreFeature } from './uploads/photos.startup';
import { swapsRouter } from './swaps/swaps.routes';
import { blocksRouter } from './blocks/blocks.routes';
import { distributionRouter } from './distribution/distribution.routes';
import { exportsRouter } from './exports/exports.routes';
import { sewDaysRouter } from './sewdays/sewdays.routes';
import { notificationsRouter } from './notifications/notifications.routes';
import { mailJobsFeature } from './mail/mail.startup';
import { chatRouter } from './chat/chat.routes';
import { boardRouter } from './board/board.routes';
import { photoEstimatesRouter } from './photo-estimates/photo-estimates.routes';
import { intakeRouter } from './intake/intake.routes';
import { homeRouter } from './home/home.routes';
import { paymentsRouter } from './payments/payments.routes';
import { paymentsFeature } from './payments/payments.startup';
import { designsRouter } from './designs/designs.routes';
import { photoColourBackfillFeature } from './uploads/photo-colour';

export type FeatureRouter = (deps: AppDeps) => Router;

export interface FeatureContext {
  server: Server;
  deps: AppDeps;
  built: BuiltApp;
}

/** A running part of the process that must stop cleanly on shutdown. */
export interface FeatureHandle {
  name: string;
  close(): Promise<void>;
}

export type FeatureStartup = (ctx: FeatureContext) => Promise<FeatureHandle>;

export const featureRouters: FeatureRouter[] = [
  sewDaysRouter,
  chatRouter,
  boardRouter,
  swapsRouter,
  blocksRouter,
  distributionRouter,
  exportsRouter,
  photosRouter,
  notificationsRouter,
  intakeRouter,
  photoEstimatesRouter,
  homeRouter,
  paymentsRouter,
  designsRouter,
];

/** The socket.io server with every live part: swap boards, sew-day and swap chat. */
const liveFeature = liveStartup([boardLive(), chatLive]);

// The photo store's owner check comes first: a store that is another install's stops the start untouched.
export const featureStartups: FeatureStartup[] = [
  photoStoreFeature,
  liveFeature,
  mailJobsFeature,
  paymentsFeature,
  photoColourBackfillFeature,
];
