import { inject } from 'vitest';

/**
 * Settings that point the app's payments SDK at the local payments fake the test run started.
 * The webhook secret is only right for endpoints registered with it; tests that receive the fake's
 * webhooks register their own endpoint and pass its secret.
 */
export function paymentsOverrides(webhookSecret = 'whsec_test_matrix'): Record<string, string> {
  return {
    STRIPE_SECRET_KEY: 'sk_test_blockpost',
    STRIPE_WEBHOOK_SECRET: webhookSecret,
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(inject('paymentsPort')),
    STRIPE_API_PROTOCOL: 'http',
  };
}
