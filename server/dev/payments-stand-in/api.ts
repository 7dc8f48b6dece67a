import express, { type Request, type Response } from 'express';
import type { ApiFaults } from './control';
import { API_VERSION, type Engine } from './engine';
import { ApiError, invalidParam, invalidRequest, missingParam, noSuch } from './errors';
import {
  expandParam,
  fingerprint,
  metadataParam,
  oneOf,
  onlyKnown,
  optArray,
  optBool,
  optCurrency,
  optInt,
  optObject,
  optString,
  parseForm,
  reqCurrency,
  reqInt,
  reqString,
  type Params,
} from './params';
import { newId } from './store';
import type { Account, BalanceTransaction, CheckoutSession, LineItem, ListObject } from './types';
import type { WebhookSender } from './webhooks';

const IDEMPOTENCY_TTL_MS = 24 * 3600_000;

interface ApiCall {
  params: Params;
  path: Record<string, string>;
  /** Where the stand-in's own pages are reached, e.g. http://127.0.0.1:12111 */
  baseUrl: string;
  /** The request path, e.g. /v1/transfers, for list envelopes. */
  url: string;
}

type Handler = (call: ApiCall) => object;

export interface ApiOptions {
  secretKey: string;
  publicUrl?: string;
  log: (line: string) => void;
}

/** The key a request presents: `Authorization: Bearer sk_…` (or HTTP Basic with the key as user name). */
export function presentedKey(req: Request): string | undefined {
  const header = req.get('authorization') ?? '';
  const bearer = /^Bearer\s+(\S+)\s*$/i.exec(header);
  if (bearer) return bearer[1];
  const basic = /^Basic\s+(\S+)\s*$/i.exec(header);
  if (basic) return Buffer.from(basic[1], 'base64').toString('utf8').split(':')[0] || undefined;
  return undefined;
}

export function baseUrlOf(req: Request, publicUrl: string | undefined): string {
  return (publicUrl ?? `${req.protocol}://${req.get('host')}`).replace(/\/+$/, '');
}

const LIST_PARAMS = ['limit', 'starting_after', 'ending_before', 'expand', 'created'] as const;

function listOf<T extends { id: string }>(itemsNewestFirst: T[], params: Params, url: string): ListObject<T> {
  const limit = optInt(params.limit, 'limit', 1) ?? 10;
  if (limit > 100) throw invalidParam('limit', 'Invalid limit: must be at most 100');
  const after = optString(params.starting_after, 'starting_after');
  const before = optString(params.ending_before, 'ending_before');
  const indexOf = (id: string, param: string) => {
    const index = itemsNewestFirst.findIndex((item) => item.id === id);
    if (index < 0) throw invalidRequest(`No such object: '${id}'`, { code: 'resource_missing', param });
    return index;
  };
  if (before) {
    const end = indexOf(before, 'ending_before');
    const start = Math.max(0, end - limit);
    return { object: 'list', data: itemsNewestFirst.slice(start, end), has_more: start > 0, url };
  }
  const start = after ? indexOf(after, 'starting_after') + 1 : 0;
  return {
    object: 'list',
    data: itemsNewestFirst.slice(start, start + limit),
    has_more: itemsNewestFirst.length > start + limit,
    url,
  };
}

const newestFirst = <T>(table: Record<string, T>): T[] => Object.values(table).reverse();

export function apiRouter(engine: Engine, sender: WebhookSender, faults: ApiFaults, options: ApiOptions) {
  const router = express.Router();
  router.use(express.raw({ type: () => true, limit: '2mb' }));
  const state = () => engine.state;
  const inFlight = new Set<string>();

  // ── expansion ─────────────────────────────────────────────────────────

  const lookupForExpand = (id: string): unknown => {
    const found = engine.lookup(id);
    if (found && (found as { object?: string }).object === 'balance_transaction') {
      return engine.balanceTransactionView(found as BalanceTransaction);
    }
    return found;
  };

  const lineItemsList = (session: CheckoutSession): ListObject<LineItem> => ({
    object: 'list',
    data: structuredClone(state().sessionDetails[session.id]?.lineItems ?? []),
    has_more: false,
    url: `/v1/checkout/sessions/${session.id}/line_items`,
  });

  function expandAt(target: Record<string, unknown>, segments: string[], whole: string) {
    const [head, ...rest] = segments;
    if (head === 'line_items' && target.object === 'checkout.session') {
      target.line_items = lineItemsList(target as unknown as CheckoutSession);
    } else if (typeof target[head] === 'string') {
      const found = lookupForExpand(target[head] as string);
      if (!found) throw invalidParam('expand', `This property cannot be expanded (${whole}).`);
      target[head] = structuredClone(found);
    } else if (target[head] === null) {
      return;
    } else if (!target[head] || typeof target[head] !== 'object') {
      throw invalidParam('expand', `This property cannot be expanded (${whole}).`);
    }
    if (rest.length === 0) return;
    const next = target[head];
    if (Array.isArray(next)) {
      for (const item of next) if (item && typeof item === 'object') expandAt(item as Record<string, unknown>, rest, whole);
    } else if (next && typeof next === 'object') {
      expandAt(next as Record<string, unknown>, rest, whole);
    }
  }

  function withExpansions(body: object, paths: string[]): object {
    for (const path of paths) {
      const segments = path.split('.');
      if (segments.length > 4) throw invalidParam('expand', `You cannot expand more than 4 levels of a property (${path}).`);
      expandAt(body as Record<string, unknown>, segments, path);
    }
    return body;
  }

  // ── the request pipeline ──────────────────────────────────────────────

  function readParams(req: Request): Params {
    const query = parseForm(req.originalUrl.split('?')[1] ?? '');
    if (req.method === 'GET' || req.method === 'DELETE') return query;
    const raw = Buffer.isBuffer(req.body) ? req.body.toString('utf8') : '';
    if (!raw) return query;
    if (/json/i.test(req.get('content-type') ?? '')) {
      try {
        return { ...query, ...(JSON.parse(raw) as Params) };
      } catch {
        throw invalidRequest('Invalid JSON body.');
      }
    }
    return { ...query, ...parseForm(raw) };
  }

  const wrap = (handler: Handler) => async (req: Request, res: Response) => {
    const requestId = newId('req_', 14);
    const send = (status: number, body: unknown, headers: Record<string, string> = {}) => {
      res.status(status).set({ 'Request-Id': requestId, 'Stripe-Version': API_VERSION, ...headers });
      res.type('application/json').send(JSON.stringify(body, null, 2));
    };
    const key = presentedKey(req);
    if (!key) {
      return send(401, {
        error: {
          type: 'authentication_error',
          message: 'You did not provide an API key. Provide it in the Authorization header, using Bearer auth.',
        },
      });
    }
    if (key !== options.secretKey) {
      return send(401, {
        error: { type: 'authentication_error', message: `Invalid API Key provided: ${key.slice(0, 8)}${'*'.repeat(8)}${key.slice(-4)}` },
      });
    }
    if (faults.failNext > 0 && (!faults.failPath || req.path.includes(faults.failPath))) {
      faults.failNext -= 1;
      return send(faults.failStatus, {
        error: { type: faults.failStatus === 429 ? 'rate_limit_error' : 'api_error', message: 'A failure the test controls asked for.' },
      });
    }
    let params: Params;
    try {
      params = readParams(req);
    } catch (error) {
      if (error instanceof ApiError) return send(error.status, error.toJSON());
      throw error;
    }
    const path = req.originalUrl.split('?')[0];
    const idempotencyKey = req.method === 'POST' ? req.get('idempotency-key') || undefined : undefined;
    const print = fingerprint({ method: req.method, path, params });
    if (idempotencyKey) {
      if (idempotencyKey.length > 255) {
        return send(400, { error: { type: 'invalid_request_error', message: 'Idempotency keys can be at most 255 characters long.' } });
      }
      const stored = state().idempotency[idempotencyKey];
      if (stored && stored.createdAt + IDEMPOTENCY_TTL_MS > Date.now()) {
        if (stored.fingerprint !== print) {
          return send(400, {
            error: {
              type: 'idempotency_error',
              message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
            },
          });
        }
        return send(stored.status, stored.body, { 'Idempotent-Replayed': 'true', 'Idempotency-Key': idempotencyKey });
      }
      if (inFlight.has(idempotencyKey)) {
        return send(409, {
          error: {
            type: 'idempotency_error',
            code: 'idempotency_key_in_use',
            message:
              'There is currently another in-progress request using this Idempotent Key (probably because of a network blip). Please try again later.',
          },
        });
      }
      inFlight.add(idempotencyKey);
    }
    try {
      if (faults.latencyMs > 0) await new Promise((resolve) => setTimeout(resolve, faults.latencyMs));
      let status = 200;
      let body: unknown;
      const eventsBefore = Object.keys(state().events).length;
      engine.currentRequest = { id: requestId, idempotencyKey: idempotencyKey ?? null };
      try {
        const expand = expandParam(params);
        const result = handler({ params, path: req.params as Record<string, string>, baseUrl: baseUrlOf(req, options.publicUrl), url: path });
        body = withExpansions(structuredClone(result), expand);
      } catch (error) {
        if (!(error instanceof ApiError)) {
          options.log(`internal error on ${req.method} ${path}: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
        }
        const apiError = error instanceof ApiError ? error : new ApiError(500, { type: 'api_error', message: 'The payment stand-in failed; see its log.' });
        status = apiError.status;
        body = apiError.toJSON();
      } finally {
        engine.currentRequest = { id: null, idempotencyKey: null };
      }
      // As the provider does: a result is kept when the request ran (success or
      // card error); a request refused by validation can be retried with its key.
      if (idempotencyKey && (status < 300 || status === 402)) {
        state().idempotency[idempotencyKey] = { fingerprint: print, method: req.method, path, status, body, createdAt: Date.now() };
      }
      if (req.method !== 'GET' || Object.keys(state().events).length !== eventsBefore) await engine.store.save();
      send(status, body, idempotencyKey ? { 'Idempotency-Key': idempotencyKey } : {});
      sender.kick();
    } finally {
      if (idempotencyKey) inFlight.delete(idempotencyKey);
    }
  };

  const get = (path: string, handler: Handler) => router.get(path, wrap(handler));
  const post = (path: string, handler: Handler) => router.post(path, wrap(handler));

  // ── accounts ──────────────────────────────────────────────────────────

  const capabilityRequests = (value: unknown): string[] => {
    const capabilities = optObject(value, 'capabilities') ?? {};
    return Object.entries(capabilities)
      .filter(([name, entry]) => optBool(optObject(entry, `capabilities[${name}]`)?.requested, `capabilities[${name}][requested]`))
      .map(([name]) => name);
  };

  const businessProfile = (value: unknown): Partial<Account['business_profile']> => {
    const profile = optObject(value, 'business_profile') ?? {};
    const out: Partial<Account['business_profile']> = {};
    for (const field of ['name', 'url', 'mcc', 'product_description'] as const) {
      const text = optString(profile[field], `business_profile[${field}]`);
      if (text !== undefined) out[field] = text;
    }
    return out;
  };

  const ACCOUNT_EXTRA_PARAMS = ['settings', 'tos_acceptance', 'company', 'individual', 'external_account', 'documents', 'account_token'];

  post('/accounts', ({ params }) => {
    onlyKnown(params, [
      'type',
      'controller',
      'country',
      'email',
      'business_type',
      'business_profile',
      'capabilities',
      'metadata',
      'default_currency',
      'expand',
      ...ACCOUNT_EXTRA_PARAMS,
    ]);
    const controller = optObject(params.controller, 'controller') ?? null;
    let type = oneOf(optString(params.type, 'type'), 'type', ['express', 'standard', 'custom'] as const);
    if (!type) {
      const dashboard = (controller?.stripe_dashboard as Params | undefined)?.type;
      type = dashboard === 'express' ? 'express' : dashboard === 'none' ? 'custom' : 'standard';
    }
    return engine.createAccount({
      type,
      controller,
      country: (optString(params.country, 'country') ?? 'US').toUpperCase(),
      email: optString(params.email, 'email') ?? null,
      businessType: optString(params.business_type, 'business_type') ?? null,
      businessProfile: businessProfile(params.business_profile),
      capabilities: capabilityRequests(params.capabilities),
      metadata: metadataParam(params.metadata),
      defaultCurrency: optCurrency(params.default_currency, 'default_currency') ?? 'usd',
    });
  });

  get('/accounts', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS]);
    return listOf(newestFirst(state().accounts), params, url);
  });

  get('/accounts/:id', ({ path }) => engine.account(path.id));

  post('/accounts/:id', ({ params, path }) => {
    onlyKnown(params, ['email', 'business_type', 'business_profile', 'capabilities', 'metadata', 'expand', ...ACCOUNT_EXTRA_PARAMS]);
    const account = engine.account(path.id);
    engine.updateAccount(account, {
      email: optString(params.email, 'email'),
      metadata: params.metadata === undefined ? undefined : metadataParam(params.metadata, 'metadata', account.metadata),
      businessProfile: businessProfile(params.business_profile),
      requestCapabilities: capabilityRequests(params.capabilities),
    });
    return account;
  });

  post('/account_links', ({ params, baseUrl }) => {
    onlyKnown(params, ['account', 'type', 'refresh_url', 'return_url', 'collect', 'collection_options', 'expand']);
    const account = engine.account(reqString(params.account, 'account'), 'account');
    const type = oneOf(reqString(params.type, 'type'), 'type', ['account_onboarding', 'account_update'] as const)!;
    const refreshUrl = reqString(params.refresh_url, 'refresh_url');
    const returnUrl = reqString(params.return_url, 'return_url');
    for (const [param, value] of [['refresh_url', refreshUrl], ['return_url', returnUrl]] as const) {
      if (!URL.canParse(value)) throw invalidParam(param, `Not a valid URL: ${value}`);
    }
    const created = engine.now();
    const token = newId('', 32);
    state().accountLinks[token] = {
      token,
      account: account.id,
      type,
      refresh_url: refreshUrl,
      return_url: returnUrl,
      created,
      expires_at: created + 300,
      used: false,
    };
    return { object: 'account_link', created, expires_at: created + 300, url: `${baseUrl}/connect/onboarding/${token}` };
  });

  // ── checkout sessions ────────────────────────────────────────────────

  const MINIMUM_CHARGE: Record<string, number> = { usd: 50, eur: 50, gbp: 30, cad: 50, aud: 50 };

  post('/checkout/sessions', ({ params, baseUrl }) => {
    onlyKnown(params, [
      'mode',
      'line_items',
      'success_url',
      'cancel_url',
      'metadata',
      'payment_intent_data',
      'client_reference_id',
      'customer_email',
      'expires_at',
      'payment_method_types',
      'locale',
      'submit_type',
      'billing_address_collection',
      'currency',
      'expand',
      'ui_mode',
      'allow_promotion_codes',
      'custom_text',
      'phone_number_collection',
      'consent_collection',
    ]);
    const mode = reqString(params.mode, 'mode');
    if (mode !== 'payment') throw invalidParam('mode', `The local payment stand-in supports mode=payment only (got ${mode}).`);
    const successUrl = reqString(params.success_url, 'success_url');
    if (!URL.canParse(successUrl.replace('{CHECKOUT_SESSION_ID}', 'x'))) throw invalidParam('success_url', `Not a valid URL: ${successUrl}`);
    const cancelUrl = optString(params.cancel_url, 'cancel_url') ?? null;
    if (cancelUrl && !URL.canParse(cancelUrl.replace('{CHECKOUT_SESSION_ID}', 'x'))) throw invalidParam('cancel_url', `Not a valid URL: ${cancelUrl}`);
    const items = optArray(params.line_items, 'line_items');
    if (!items || items.length === 0) throw missingParam('line_items');

    const lineItems: LineItem[] = items.map((raw, i) => {
      const param = `line_items[${i}]`;
      const item = optObject(raw, param) ?? {};
      onlyKnown(item, ['price_data', 'quantity', 'price', 'adjustable_quantity', 'tax_rates', 'dynamic_tax_rates'], param);
      if (item.price !== undefined) {
        throw invalidParam(`${param}[price]`, 'The local payment stand-in keeps no price objects; give price_data instead.');
      }
      const priceData = optObject(item.price_data, `${param}[price_data]`);
      if (!priceData) throw missingParam(`${param}[price_data]`);
      onlyKnown(priceData, ['currency', 'unit_amount', 'unit_amount_decimal', 'product_data', 'product', 'tax_behavior', 'recurring'], `${param}[price_data]`);
      if (priceData.recurring !== undefined) throw invalidParam(`${param}[price_data][recurring]`, 'Recurring prices need mode=subscription, which the stand-in does not offer.');
      const currency = reqCurrency(priceData.currency, `${param}[price_data][currency]`);
      const unitAmount = reqInt(priceData.unit_amount, `${param}[price_data][unit_amount]`, 0);
      const productData = optObject(priceData.product_data, `${param}[price_data][product_data]`);
      const productId = optString(priceData.product, `${param}[price_data][product]`);
      const name = productData ? reqString(productData.name, `${param}[price_data][product_data][name]`) : productId;
      if (!name) throw missingParam(`${param}[price_data][product_data]`);
      const quantity = reqInt(item.quantity, `${param}[quantity]`, 1);
      return {
        id: newId('li_'),
        object: 'item',
        amount_discount: 0,
        amount_subtotal: unitAmount * quantity,
        amount_tax: 0,
        amount_total: unitAmount * quantity,
        currency,
        description: name,
        price: {
          id: newId('price_'),
          object: 'price',
          currency,
          unit_amount: unitAmount,
          product: productId ?? newId('prod_', 14),
          type: 'one_time',
          active: false,
          livemode: false,
        },
        quantity,
      };
    });
    const currency = lineItems[0].currency;
    lineItems.forEach((item, i) => {
      if (item.currency !== currency) throw invalidParam(`line_items[${i}][price_data][currency]`, 'All line items must use the same currency.');
    });
    const amountTotal = lineItems.reduce((sum, item) => sum + item.amount_total, 0);
    const minimum = MINIMUM_CHARGE[currency];
    if (minimum !== undefined && amountTotal < minimum) {
      throw invalidRequest(`The Checkout Session's total amount due must add up to at least ${minimum} ${currency} (in the smallest unit).`, {
        code: 'amount_too_small',
        param: 'line_items',
      });
    }

    const pid = optObject(params.payment_intent_data, 'payment_intent_data') ?? {};
    onlyKnown(
      pid,
      [
        'transfer_group',
        'metadata',
        'description',
        'receipt_email',
        'capture_method',
        'statement_descriptor',
        'statement_descriptor_suffix',
        'shipping',
        'application_fee_amount',
        'transfer_data',
        'on_behalf_of',
      ],
      'payment_intent_data',
    );
    for (const field of ['application_fee_amount', 'transfer_data', 'on_behalf_of']) {
      if (pid[field] !== undefined) {
        throw invalidParam(
          `payment_intent_data[${field}]`,
          `payment_intent_data[${field}] belongs to destination charges; this project uses separate charges and transfers, and the local stand-in does not take it.`,
        );
      }
    }
    const captureMethod = optString(pid.capture_method, 'payment_intent_data[capture_method]');
    if (captureMethod && captureMethod !== 'automatic' && captureMethod !== 'automatic_async') {
      throw invalidParam('payment_intent_data[capture_method]', 'The local stand-in captures automatically only.');
    }

    const created = engine.now();
    const expiresAt = optInt(params.expires_at, 'expires_at') ?? created + 24 * 3600;
    if (expiresAt < created + 30 * 60 - 5 || expiresAt > created + 24 * 3600) {
      throw invalidParam('expires_at', 'The Checkout Session must expire between 30 minutes and 24 hours after creation.');
    }
    const id = newId('cs_test_', 40);
    const session: CheckoutSession = {
      id,
      object: 'checkout.session',
      amount_subtotal: amountTotal,
      amount_total: amountTotal,
      cancel_url: cancelUrl,
      client_reference_id: optString(params.client_reference_id, 'client_reference_id') ?? null,
      created,
      currency,
      customer: null,
      customer_details: null,
      customer_email: optString(params.customer_email, 'customer_email') ?? null,
      expires_at: expiresAt,
      livemode: false,
      locale: optString(params.locale, 'locale') ?? null,
      metadata: metadataParam(params.metadata),
      mode: 'payment',
      payment_intent: null,
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      success_url: successUrl,
      total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
      ui_mode: 'hosted',
      url: `${baseUrl}/pay/${id}`,
    };
    state().checkoutSessions[id] = session;
    state().sessionDetails[id] = {
      lineItems,
      paymentIntentData: {
        transfer_group: optString(pid.transfer_group, 'payment_intent_data[transfer_group]') ?? null,
        metadata: metadataParam(pid.metadata, 'payment_intent_data[metadata]'),
        description: optString(pid.description, 'payment_intent_data[description]') ?? null,
        receipt_email: optString(pid.receipt_email, 'payment_intent_data[receipt_email]') ?? null,
      },
    };
    return session;
  });

  get('/checkout/sessions', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'payment_intent', 'status']);
    const intent = optString(params.payment_intent, 'payment_intent');
    const status = optString(params.status, 'status');
    engine.expireDueSessions();
    const items = newestFirst(state().checkoutSessions).filter(
      (s) => (!intent || s.payment_intent === intent) && (!status || s.status === status),
    );
    return listOf(items, params, url);
  });

  get('/checkout/sessions/:id', ({ path }) => engine.session(path.id));

  get('/checkout/sessions/:id/line_items', ({ path, params, url }) => {
    onlyKnown(params, [...LIST_PARAMS]);
    const session = engine.session(path.id);
    return listOf(state().sessionDetails[session.id]?.lineItems ?? [], params, url);
  });

  post('/checkout/sessions/:id/expire', ({ path, params }) => {
    onlyKnown(params, ['expand']);
    const session = engine.session(path.id);
    engine.expireSession(session);
    return session;
  });

  // ── payment intents and charges ──────────────────────────────────────

  get('/payment_intents', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'customer']);
    return listOf(newestFirst(state().paymentIntents), params, url);
  });
  get('/payment_intents/:id', ({ path }) => engine.paymentIntent(path.id));

  get('/charges', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'payment_intent', 'transfer_group', 'customer']);
    const intent = optString(params.payment_intent, 'payment_intent');
    const group = optString(params.transfer_group, 'transfer_group');
    const items = newestFirst(state().charges).filter(
      (c) => (!intent || c.payment_intent === intent) && (!group || c.transfer_group === group),
    );
    return listOf(items, params, url);
  });
  get('/charges/:id', ({ path }) => engine.charge(path.id));

  // ── refunds ──────────────────────────────────────────────────────────

  post('/refunds', ({ params }) => {
    onlyKnown(params, [
      'charge',
      'payment_intent',
      'amount',
      'reason',
      'metadata',
      'expand',
      'refund_application_fee',
      'reverse_transfer',
      'instructions_email',
      'origin',
    ]);
    const charge = optString(params.charge, 'charge');
    const paymentIntent = optString(params.payment_intent, 'payment_intent');
    if (!charge && !paymentIntent) throw invalidRequest('One of the following params should be provided for this request: payment_intent or charge.', { code: 'parameter_missing' });
    if (charge && paymentIntent) throw invalidRequest('Only one of payment_intent or charge can be provided.', { code: 'parameter_invalid', param: 'charge' });
    if (optBool(params.reverse_transfer, 'reverse_transfer')) {
      throw invalidParam('reverse_transfer', 'reverse_transfer belongs to destination charges; reverse the transfer with POST /v1/transfers/:id/reversals instead.');
    }
    return engine.createRefund({
      charge,
      paymentIntent,
      amount: optInt(params.amount, 'amount'),
      reason: oneOf(optString(params.reason, 'reason'), 'reason', ['duplicate', 'fraudulent', 'requested_by_customer'] as const),
      metadata: metadataParam(params.metadata),
    });
  });

  get('/refunds', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'charge', 'payment_intent']);
    const charge = optString(params.charge, 'charge');
    const intent = optString(params.payment_intent, 'payment_intent');
    const items = newestFirst(state().refunds).filter((r) => (!charge || r.charge === charge) && (!intent || r.payment_intent === intent));
    return listOf(items, params, url);
  });

  get('/refunds/:id', ({ path }) => {
    const refund = state().refunds[path.id];
    if (!refund) throw noSuch('refund', path.id);
    return refund;
  });

  // ── transfers and reversals ──────────────────────────────────────────

  post('/transfers', ({ params }) => {
    onlyKnown(params, ['amount', 'currency', 'destination', 'transfer_group', 'source_transaction', 'metadata', 'description', 'expand', 'source_type']);
    return engine.createTransfer({
      amount: reqInt(params.amount, 'amount', 1),
      currency: reqCurrency(params.currency, 'currency'),
      destination: reqString(params.destination, 'destination'),
      transferGroup: optString(params.transfer_group, 'transfer_group'),
      sourceTransaction: optString(params.source_transaction, 'source_transaction'),
      description: optString(params.description, 'description'),
      metadata: metadataParam(params.metadata),
    });
  });

  get('/transfers', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'transfer_group', 'destination']);
    const group = optString(params.transfer_group, 'transfer_group');
    const destination = optString(params.destination, 'destination');
    const items = newestFirst(state().transfers).filter(
      (t) => (!group || t.transfer_group === group) && (!destination || t.destination === destination),
    );
    return listOf(items, params, url);
  });

  get('/transfers/:id', ({ path }) => engine.transfer(path.id));

  post('/transfers/:id', ({ path, params }) => {
    onlyKnown(params, ['metadata', 'description', 'expand']);
    const transfer = engine.transfer(path.id);
    if (params.metadata !== undefined) transfer.metadata = metadataParam(params.metadata, 'metadata', transfer.metadata);
    const description = optString(params.description, 'description');
    if (description !== undefined) transfer.description = description;
    return transfer;
  });

  post('/transfers/:id/reversals', ({ path, params }) => {
    onlyKnown(params, ['amount', 'description', 'metadata', 'refund_application_fee', 'expand']);
    const transfer = engine.transfer(path.id);
    return engine.createReversal(transfer, {
      amount: optInt(params.amount, 'amount'),
      description: optString(params.description, 'description'),
      metadata: metadataParam(params.metadata),
    });
  });

  get('/transfers/:id/reversals', ({ path, params, url }) => {
    onlyKnown(params, [...LIST_PARAMS]);
    engine.transfer(path.id);
    return listOf(engine.reversalsOf(path.id), params, url);
  });

  get('/transfers/:id/reversals/:reversal', ({ path }) => {
    const reversal = state().reversals[path.reversal];
    if (!reversal || reversal.transfer !== path.id) throw noSuch('transfer_reversal', path.reversal);
    return reversal;
  });

  // ── balance ──────────────────────────────────────────────────────────

  get('/balance', () => engine.balance());

  get('/balance_transactions', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'type', 'source', 'currency']);
    const type = optString(params.type, 'type');
    const source = optString(params.source, 'source');
    const items = newestFirst(state().balanceTransactions)
      .filter((t) => (!type || t.type === type) && (!source || t.source === source))
      .map((t) => engine.balanceTransactionView(t));
    return listOf(items, params, url);
  });

  get('/balance_transactions/:id', ({ path }) => {
    const txn = state().balanceTransactions[path.id];
    if (!txn) throw noSuch('balance_transaction', path.id);
    return engine.balanceTransactionView(txn);
  });

  // ── events ───────────────────────────────────────────────────────────

  get('/events', ({ params, url }) => {
    onlyKnown(params, [...LIST_PARAMS, 'type', 'types', 'delivery_success']);
    const type = optString(params.type, 'type');
    const types = (optArray(params.types, 'types') ?? []).map((t, i) => reqString(t, `types[${i}]`));
    const matches = (eventType: string) => {
      if (types.length > 0 && !types.includes(eventType)) return false;
      if (!type) return true;
      if (type.endsWith('*')) return eventType.startsWith(type.slice(0, -1));
      return eventType === type;
    };
    return listOf(
      newestFirst(state().events).filter((e) => matches(e.type)),
      params,
      url,
    );
  });

  get('/events/:id', ({ path }) => {
    const event = state().events[path.id];
    if (!event) throw noSuch('event', path.id);
    return event;
  });

  // ── anything else ────────────────────────────────────────────────────

  router.use((req, res) =>
    wrap(() => {
      throw new ApiError(404, {
        type: 'invalid_request_error',
        message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). The local payment stand-in offers only the subset in shared/payments.md.`,
      });
    })(req, res),
  );

  return router;
}
