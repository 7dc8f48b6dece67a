import express, { type Request, type Response } from 'express';
import { baseUrlOf } from './api';
import { type Engine, type PaymentOutcome } from './engine';
import type { CheckoutSession } from './types';
import type { WebhookSender } from './webhooks';

/**
 * The stand-in's own plain pages: the hosted payment page behind
 * `checkout.session.url` and the payout onboarding page behind
 * `account_link.url`. No scripts; forms post back here.
 */

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (ch) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[ch]!);

export function formatAmount(amount: number, currency: string): string {
  const format = new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() });
  const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
  return format.format(amount / 10 ** digits);
}

const STYLE = `body{font-family:system-ui,sans-serif;max-width:34rem;margin:2rem auto;padding:0 1rem;line-height:1.5;color:#1b1f23}
.banner{background:#fff4ce;border:1px solid #c9a400;padding:.5rem .75rem;border-radius:.25rem;font-size:.9rem}
.error{background:#fde8e8;border:1px solid #b42318;color:#7a1a12;padding:.5rem .75rem;border-radius:.25rem}
label{display:block;margin-top:.75rem;font-weight:600}input{display:block;font:inherit;padding:.4rem;margin-top:.25rem;width:100%;box-sizing:border-box}
button{font:inherit;margin-top:1rem;padding:.5rem 1rem;cursor:pointer}table{width:100%;border-collapse:collapse}td,th{text-align:left;padding:.25rem 0}
td.num,th.num{text-align:right}.total{font-weight:700;border-top:1px solid #999}code{background:#f1f1f1;padding:0 .2rem}`;

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${escapeHtml(title)} · local test payment page</title><link rel="icon" href="data:,"><style>${STYLE}</style></head>
<body><main>
<p class="banner" role="note"><strong>Local test payment page.</strong> This is Tenthmark's stand-in for the payment provider on a developer's machine: no real card is charged and no money moves.</p>
${body}
</main></body></html>`;
}

const send = (res: Response, status: number, html: string) => {
  res.status(status).set('Cache-Control', 'no-store').type('html').send(html);
};

const withSessionId = (url: string, id: string) => url.replaceAll('{CHECKOUT_SESSION_ID}', id);

function summary(engine: Engine, session: CheckoutSession): string {
  const items = engine.state.sessionDetails[session.id]?.lineItems ?? [];
  const rows = items
    .map(
      (item) =>
        `<tr><td>${escapeHtml(item.description)}</td><td class="num">${item.quantity}</td><td class="num">${formatAmount(item.amount_total, item.currency)}</td></tr>`,
    )
    .join('');
  return `<table><thead><tr><th>Item</th><th class="num">Qty</th><th class="num">Amount</th></tr></thead><tbody>${rows}
<tr class="total"><td colspan="2">Total</td><td class="num" data-testid="total">${formatAmount(session.amount_total, session.currency)}</td></tr></tbody></table>`;
}

function cardForm(engine: Engine, session: CheckoutSession, error?: string): string {
  const cancel = session.cancel_url
    ? `<p><a href="${escapeHtml(withSessionId(session.cancel_url, session.id))}">Cancel and go back</a></p>`
    : '';
  return `<h1>Pay ${formatAmount(session.amount_total, session.currency)}</h1>
${summary(engine, session)}
${error ? `<p class="error" role="alert" id="payment-error">${escapeHtml(error)}</p>` : ''}
<form method="post" action="/pay/${escapeHtml(session.id)}">
<label for="card_number">Card number</label>
<input id="card_number" name="card_number" inputmode="numeric" autocomplete="cc-number" required placeholder="4242 4242 4242 4242">
<label for="exp">Expiry (MM / YY)</label>
<input id="exp" name="exp" autocomplete="cc-exp" value="12 / 34">
<label for="cvc">CVC</label>
<input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" value="123">
<button type="submit">Pay ${formatAmount(session.amount_total, session.currency)}</button>
</form>
${cancel}
<details><summary>Test cards this page accepts</summary><ul>
<li><code>4242 4242 4242 4242</code>: succeeds</li>
<li><code>4000 0000 0000 0002</code>: the bank declines it</li>
<li><code>4000 0000 0000 9995</code>: the bank declines it for want of funds</li>
<li><code>4000 0027 6000 3184</code>: the bank asks you to confirm the payment</li>
</ul></details>`;
}

function authenticationStep(session: CheckoutSession): string {
  return `<h1>Confirm this payment with your bank</h1>
<p>Your bank asks you to confirm the payment of ${formatAmount(session.amount_total, session.currency)}. On this local page you choose the bank's answer.</p>
<form method="post" action="/pay/${escapeHtml(session.id)}/authenticate">
<button type="submit" name="outcome" value="approve">Approve this payment</button>
<button type="submit" name="outcome" value="fail">Decline this payment</button>
</form>`;
}

function closedSession(session: CheckoutSession): string {
  if (session.status === 'complete') {
    return page(
      'Payment complete',
      `<h1>This payment is complete</h1><p><a href="${escapeHtml(withSessionId(session.success_url, session.id))}">Continue</a></p>`,
    );
  }
  const back = session.cancel_url ? `<p><a href="${escapeHtml(withSessionId(session.cancel_url, session.id))}">Go back</a></p>` : '';
  return page('Payment page expired', `<h1>This payment page has expired</h1><p>Start the payment again from Tenthmark.</p>${back}`);
}

interface ParsedCard {
  number: string;
  expMonth: number;
  expYear: number;
}

function parseCard(body: Record<string, unknown>): ParsedCard | { error: string } {
  const number = String(body.card_number ?? '').replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(number)) return { error: 'The card number is not complete.' };
  const exp = String(body.exp ?? '').trim();
  if (!exp) return { number, expMonth: 12, expYear: 2034 };
  const match = /^(\d{1,2})\s*\/\s*(\d{2}|\d{4})$/.exec(exp);
  if (!match) return { error: 'The expiry date is not complete: write it as MM / YY.' };
  const expMonth = Number(match[1]);
  const expYear = match[2].length === 2 ? 2000 + Number(match[2]) : Number(match[2]);
  if (expMonth < 1 || expMonth > 12) return { error: 'The expiry month must be from 01 to 12.' };
  const now = new Date();
  if (expYear < now.getFullYear() || (expYear === now.getFullYear() && expMonth < now.getMonth() + 1)) {
    return { error: 'This card has expired: its expiry date has passed.' };
  }
  return { number, expMonth, expYear };
}

export function pagesRouter(engine: Engine, sender: WebhookSender, options: { publicUrl?: string }) {
  const router = express.Router();
  router.use(express.urlencoded({ extended: false, limit: '64kb' }));
  const persist = async () => {
    await engine.store.save();
    sender.kick();
  };
  const findSession = (req: Request) => {
    const session = engine.state.checkoutSessions[String(req.params.id)];
    if (session) engine.expireIfDue(session);
    return session;
  };
  const notFound = (res: Response) => send(res, 404, page('Not found', '<h1>There is no such payment page</h1>'));

  const answer = (res: Response, session: CheckoutSession, outcome: PaymentOutcome) => {
    switch (outcome.kind) {
      case 'succeeded':
        return res.redirect(303, withSessionId(session.success_url, session.id));
      case 'requires_action':
        return send(res, 200, page('Authenticate', authenticationStep(session)));
      case 'declined':
        return send(res, 402, page('Payment declined', cardForm(engine, session, outcome.message)));
      case 'rejected':
        if (session.status !== 'open') return send(res, 410, closedSession(session));
        return send(res, 400, page('Check your card', cardForm(engine, session, outcome.message)));
    }
  };

  router.get('/pay/:id', async (req, res) => {
    const session = findSession(req);
    if (!session) return notFound(res);
    if (session.status !== 'open') {
      await persist();
      return send(res, 200, closedSession(session));
    }
    const intent = typeof session.payment_intent === 'string' ? engine.state.paymentIntents[session.payment_intent] : undefined;
    if (intent?.status === 'requires_action') return send(res, 200, page('Authenticate', authenticationStep(session)));
    send(res, 200, page('Pay', cardForm(engine, session, intent?.last_payment_error?.message)));
  });

  router.post('/pay/:id', async (req, res) => {
    const session = findSession(req);
    if (!session) return notFound(res);
    if (session.status !== 'open') {
      await persist();
      return send(res, 410, closedSession(session));
    }
    const card = parseCard((req.body ?? {}) as Record<string, unknown>);
    if ('error' in card) return send(res, 400, page('Check your card', cardForm(engine, session, card.error)));
    const authenticateUrl = `${baseUrlOf(req, options.publicUrl)}/pay/${session.id}/authenticate`;
    const outcome = engine.attemptPayment(session, card, authenticateUrl);
    await persist();
    answer(res, session, outcome);
  });

  router.post('/pay/:id/authenticate', async (req, res) => {
    const session = findSession(req);
    if (!session) return notFound(res);
    const choice = String((req.body as Record<string, unknown> | undefined)?.outcome ?? '');
    if (choice !== 'approve' && choice !== 'fail') return send(res, 400, page('Authenticate', authenticationStep(session)));
    const outcome = engine.authenticate(session, choice === 'approve');
    await persist();
    answer(res, session, outcome);
  });

  // ── payout onboarding ────────────────────────────────────────────────

  const onboardingForm = (token: string, error?: string) => {
    const grant = engine.state.accountLinks[token];
    const account = engine.state.accounts[grant.account];
    return page(
      'Set up payouts',
      `<h1>Set up payouts</h1>
<p>Payout account <code>${escapeHtml(account.id)}</code>${account.email ? ` for ${escapeHtml(account.email)}` : ''}. On this local page the test bank details are filled in for you.</p>
${error ? `<p class="error" role="alert">${escapeHtml(error)}</p>` : ''}
<form method="post" action="/connect/onboarding/${escapeHtml(token)}">
<label for="business_name">Business name</label>
<input id="business_name" name="business_name" value="${escapeHtml(account.business_profile.name ?? '')}">
<label for="routing_number">Routing number</label>
<input id="routing_number" name="routing_number" inputmode="numeric" value="110000000" required>
<label for="account_number">Account number</label>
<input id="account_number" name="account_number" inputmode="numeric" value="000123456789" required>
<button type="submit">Send my details</button>
</form>
<p><a href="${escapeHtml(grant.return_url)}">Return without finishing</a></p>`,
    );
  };

  const usableGrant = (req: Request, res: Response) => {
    const grant = engine.state.accountLinks[String(req.params.token)];
    if (!grant || !engine.state.accounts[grant.account]) {
      send(res, 404, page('Not found', '<h1>There is no such onboarding link</h1>'));
      return undefined;
    }
    if (grant.used || grant.expires_at < engine.now()) {
      res.redirect(303, grant.refresh_url);
      return undefined;
    }
    return grant;
  };

  router.get('/connect/onboarding/:token', (req, res) => {
    const grant = usableGrant(req, res);
    if (grant) send(res, 200, onboardingForm(grant.token));
  });

  router.post('/connect/onboarding/:token', async (req, res) => {
    const grant = usableGrant(req, res);
    if (!grant) return;
    const body = (req.body ?? {}) as Record<string, unknown>;
    const routingNumber = String(body.routing_number ?? '').trim();
    const accountNumber = String(body.account_number ?? '').trim();
    if (!/^\d{9}$/.test(routingNumber)) return send(res, 400, onboardingForm(grant.token, 'The routing number must be 9 digits.'));
    if (!/^\d{4,17}$/.test(accountNumber)) return send(res, 400, onboardingForm(grant.token, 'The account number must be 4 to 17 digits.'));
    const businessName = String(body.business_name ?? '').trim() || undefined;
    engine.completeOnboarding(engine.account(grant.account), { businessName, routingNumber, accountNumber });
    grant.used = true;
    await persist();
    res.redirect(303, grant.return_url);
  });

  return router;
}
