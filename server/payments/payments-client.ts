/**
 * The hosted payments service's official SDK, built once from the configuration. With a secret key
 * and no host it talks to the real service; `npm start` and the tests set STRIPE_API_HOST, _PORT and
 * _PROTOCOL to the local fake. No key: payments are off, and the routes say so.
 */
import Stripe from 'stripe';
import type { Config } from '../config';
import { AppError } from '../http/errors';

type PaymentsConfig = Pick<Config, 'STRIPE_SECRET_KEY' | 'STRIPE_API_HOST' | 'STRIPE_API_PORT' | 'STRIPE_API_PROTOCOL'>;

const clients = new WeakMap<object, Stripe>();

export function paymentsEnabled(config: PaymentsConfig): boolean {
  return Boolean(config.STRIPE_SECRET_KEY);
}

/** Test keys (and the local fake's) move no money; the screens say so. */
export function paymentsTestMode(config: PaymentsConfig): boolean {
  return Boolean(config.STRIPE_SECRET_KEY?.startsWith('sk_test_'));
}

export class PaymentsOffError extends AppError {
  constructor() {
    super(503, 'payments_off', 'Online payments are not set up on this Blockpost yet. Ask your guild’s treasurer how to pay.');
  }
}

/** The payment service did not answer or refused: nothing was charged. */
export class PaymentServiceError extends AppError {
  constructor(detail?: string) {
    super(
      502,
      'payment_service',
      `The payment service did not take the request${detail ? ` (${detail})` : ''}. Nothing was charged; please try again in a minute.`,
    );
  }
}

export function paymentsClient(config: PaymentsConfig): Stripe {
  if (!config.STRIPE_SECRET_KEY) throw new PaymentsOffError();
  let client = clients.get(config);
  if (!client) {
    client = new Stripe(config.STRIPE_SECRET_KEY, {
      maxNetworkRetries: 2,
      timeout: 15_000,
      appInfo: { name: 'Blockpost' },
      ...(config.STRIPE_API_HOST ? { host: config.STRIPE_API_HOST } : {}),
      ...(config.STRIPE_API_PORT ? { port: config.STRIPE_API_PORT } : {}),
      ...(config.STRIPE_API_PROTOCOL ? { protocol: config.STRIPE_API_PROTOCOL } : {}),
    });
    clients.set(config, client);
  }
  return client;
}

/** Runs one SDK call; its failures become a 502 a person can act on (never the SDK's own text in full). */
export async function callService<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof AppError) throw error;
    const message = (error as { message?: string }).message ?? '';
    throw new PaymentServiceError(message.slice(0, 160) || undefined);
  }
}
