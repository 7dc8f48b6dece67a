import Stripe from 'stripe';
import type { AppConfig } from '../env';

/**
 * The official SDK, pointed at the local stand-in when `apiUrl` is set and at
 * the provider otherwise. Nothing else in the app talks to the payment API.
 */
export function createPaymentsClient(config: AppConfig['payments']): Stripe {
  const common = { telemetry: false, maxNetworkRetries: 2, timeout: 15_000 } as const;
  if (!config.apiUrl) return new Stripe(config.secretKey, common);
  const url = new URL(config.apiUrl);
  return new Stripe(config.secretKey, {
    ...common,
    host: url.hostname,
    port: Number(url.port || (url.protocol === 'https:' ? 443 : 80)),
    protocol: url.protocol.replace(':', '') as 'http' | 'https',
  });
}

export type PaymentsClient = Stripe;
