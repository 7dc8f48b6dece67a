import { submitHostedPage } from '../../server/dev/payments-stand-in/page-client';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startPaymentsStandIn } from '../../server/dev/payments-stand-in';

export const TEST_WEBHOOK_SECRET = 'whsec_tenthmark_test_app_secret';

/** A payment stand-in with its state in a temporary file (so it can be restarted), not yet sending webhooks. */
export async function startTestStandIn(options: { port?: number; dataFile?: string } = {}) {
  const dataFile = options.dataFile ?? join(mkdtempSync(join(tmpdir(), 'tenthmark-pay-')), 'state.json');
  const standIn = await startPaymentsStandIn({ port: options.port ?? 0, dataFile, secretKey: 'sk_test_tenthmark_local', retry: { initialDelayMs: 100, maxDelayMs: 1_000 } });
  return { standIn, dataFile };
}

/** Points the stand-in's webhooks at an app's endpoint. */
export function sendWebhooksTo(standIn: Awaited<ReturnType<typeof startPaymentsStandIn>>, appUrl: string) {
  return standIn.control.setWebhook({ url: `${appUrl}/api/payments/webhook`, secret: TEST_WEBHOOK_SECRET });
}

/** Fills in the stand-in's onboarding page as a shop owner would (the page's own form, submitted). */
export async function completeOnboardingPage(url: string): Promise<void> {
  const done = await submitHostedPage(url);
  if (done.status !== 303) throw new Error(`the onboarding page answered ${done.status}`);
}
