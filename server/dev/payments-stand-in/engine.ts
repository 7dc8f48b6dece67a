import { invalidParam, invalidRequest, noSuch } from './errors';
import { newId, type Store } from './store';
import type {
  Account,
  BalanceTransaction,
  CardDetails,
  Charge,
  CheckoutSession,
  LastPaymentError,
  Metadata,
  PaymentIntent,
  Refund,
  State,
  StripeEvent,
  Transfer,
  TransferReversal,
} from './types';

export const API_VERSION = '2026-10-28.endive';

/** The provider's published test cards that the hosted page honours. */
export const TEST_CARDS = {
  '4242424242424242': { outcome: 'success' },
  '4000000000000002': { outcome: 'decline', declineCode: 'generic_decline', message: 'The bank declined this card.' },
  '4000000000009995': { outcome: 'decline', declineCode: 'insufficient_funds', message: 'The bank declined this card: there are not enough funds for this payment.' },
  '4000002760003184': { outcome: 'authenticate' },
} as const satisfies Record<string, { outcome: string; declineCode?: string; message?: string }>;

export const AUTHENTICATION_FAILED_MESSAGE =
  'The bank could not confirm this payment. Try again, or pay with another card.';

export type PaymentOutcome =
  | { kind: 'succeeded'; session: CheckoutSession }
  | { kind: 'declined'; message: string; code: string; declineCode?: string }
  | { kind: 'requires_action' }
  | { kind: 'rejected'; message: string };

export interface CardInput {
  number: string;
  expMonth: number;
  expYear: number;
}

const clone = <T>(value: T): T => structuredClone(value);

const emptyRequirements = () => ({
  currently_due: [] as string[],
  eventually_due: [] as string[],
  past_due: [] as string[],
  pending_verification: [] as string[],
  disabled_reason: null,
  current_deadline: null,
  errors: [] as unknown[],
});

export const ONBOARDING_REQUIREMENTS = [
  'business_profile.mcc',
  'business_profile.url',
  'business_type',
  'external_account',
  'tos_acceptance.date',
  'tos_acceptance.ip',
];

/**
 * The bookkeeping behind the API and the pages: every change to the state goes
 * through here, synchronously, so one request's changes never interleave with
 * another's. Callers persist afterwards.
 */
export class Engine {
  /** Set by the API layer while a request runs, so events can name it. */
  currentRequest: { id: string | null; idempotencyKey: string | null } = { id: null, idempotencyKey: null };
  private readonly eventListeners: Array<(event: StripeEvent) => void> = [];

  constructor(
    readonly store: Store,
    readonly settings: { fundsAvailableAfterSeconds: number },
  ) {}

  get state(): State {
    return this.store.state;
  }

  now(): number {
    return Math.floor(Date.now() / 1000);
  }

  onEvent(listener: (event: StripeEvent) => void) {
    this.eventListeners.push(listener);
  }

  // ── events ────────────────────────────────────────────────────────────

  emit(type: string, object: unknown, options: { account?: string; previous?: Record<string, unknown> } = {}): StripeEvent {
    const event: StripeEvent = {
      id: newId('evt_'),
      object: 'event',
      ...(options.account ? { account: options.account } : {}),
      api_version: API_VERSION,
      created: this.now(),
      data: { object: clone(object), ...(options.previous ? { previous_attributes: clone(options.previous) } : {}) },
      livemode: false,
      pending_webhooks: this.state.webhook ? 1 : 0,
      request: { id: this.currentRequest.id, idempotency_key: this.currentRequest.idempotencyKey },
      type,
    };
    this.state.events[event.id] = event;
    for (const listener of this.eventListeners) listener(event);
    return event;
  }

  // ── look-ups ──────────────────────────────────────────────────────────

  account(id: string, param = 'id'): Account {
    const account = this.state.accounts[id];
    if (!account) throw noSuch('account', id, param);
    return account;
  }

  session(id: string): CheckoutSession {
    const session = this.state.checkoutSessions[id];
    if (!session) throw noSuch('checkout.session', id);
    this.expireIfDue(session);
    return session;
  }

  charge(id: string, param = 'id'): Charge {
    const charge = this.state.charges[id];
    if (!charge) throw noSuch('charge', id, param);
    return charge;
  }

  paymentIntent(id: string, param = 'id'): PaymentIntent {
    const intent = this.state.paymentIntents[id];
    if (!intent) throw noSuch('payment_intent', id, param);
    return intent;
  }

  transfer(id: string, param = 'id'): Transfer {
    const transfer = this.state.transfers[id];
    if (!transfer) throw noSuch('transfer', id, param);
    return transfer;
  }

  /** Any stored object by its id, for `expand[]`. */
  lookup(id: string): unknown {
    const s = this.state;
    const tables: Array<[string, Record<string, unknown>]> = [
      ['acct_', s.accounts],
      ['cs_', s.checkoutSessions],
      ['pi_', s.paymentIntents],
      ['ch_', s.charges],
      ['re_', s.refunds],
      ['trr_', s.reversals],
      ['tr_', s.transfers],
      ['txn_', s.balanceTransactions],
      ['evt_', s.events],
    ];
    for (const [prefix, table] of tables) if (id.startsWith(prefix)) return table[id];
    return undefined;
  }

  // ── balance ───────────────────────────────────────────────────────────

  private addBalanceTransaction(input: {
    amount: number;
    currency: string;
    type: BalanceTransaction['type'];
    source: string;
    availableOn: number;
    description?: string | null;
  }): BalanceTransaction {
    const categories = { charge: 'charge', refund: 'refund', transfer: 'transfer', transfer_refund: 'transfer_reversal' } as const;
    const txn: BalanceTransaction = {
      id: newId('txn_'),
      object: 'balance_transaction',
      amount: input.amount,
      available_on: input.availableOn,
      created: this.now(),
      currency: input.currency,
      description: input.description ?? null,
      fee: 0,
      net: input.amount,
      reporting_category: categories[input.type],
      source: input.source,
      status: 'pending',
      type: input.type,
    };
    this.state.balanceTransactions[txn.id] = txn;
    return txn;
  }

  /** A balance transaction with its status as of now. */
  balanceTransactionView(txn: BalanceTransaction): BalanceTransaction {
    return { ...txn, status: txn.available_on <= this.now() ? 'available' : 'pending' };
  }

  balance() {
    const now = this.now();
    const sums = new Map<string, { available: number; pending: number }>();
    for (const txn of Object.values(this.state.balanceTransactions)) {
      const entry = sums.get(txn.currency) ?? { available: 0, pending: 0 };
      if (txn.available_on <= now) entry.available += txn.amount;
      else entry.pending += txn.amount;
      sums.set(txn.currency, entry);
    }
    if (sums.size === 0) sums.set('usd', { available: 0, pending: 0 });
    const rows = [...sums.entries()];
    return {
      object: 'balance' as const,
      available: rows.map(([currency, v]) => ({ amount: v.available, currency, source_types: { card: v.available } })),
      pending: rows.map(([currency, v]) => ({ amount: v.pending, currency, source_types: { card: v.pending } })),
      livemode: false,
    };
  }

  availableBalance(currency: string): number {
    return this.balance().available.find((row) => row.currency === currency)?.amount ?? 0;
  }

  /** Makes every pending amount available now (as if the payout schedule had passed). */
  settleFunds() {
    const now = this.now();
    for (const txn of Object.values(this.state.balanceTransactions)) {
      if (txn.available_on > now) txn.available_on = now;
    }
  }

  private chargeAvailableOn(charge: Charge): number {
    const id = typeof charge.balance_transaction === 'string' ? charge.balance_transaction : charge.balance_transaction?.id;
    const txn = id ? this.state.balanceTransactions[id] : undefined;
    return Math.max(this.now(), txn?.available_on ?? 0);
  }

  // ── accounts ──────────────────────────────────────────────────────────

  createAccount(input: {
    type: string;
    controller: Record<string, unknown> | null;
    country: string;
    email: string | null;
    businessType: string | null;
    businessProfile: Partial<Account['business_profile']>;
    capabilities: string[];
    metadata: Metadata;
    defaultCurrency: string;
  }): Account {
    const id = newId('acct_', 16);
    const account: Account = {
      id,
      object: 'account',
      type: input.type,
      controller: input.controller,
      country: input.country,
      default_currency: input.defaultCurrency,
      email: input.email,
      business_type: input.businessType,
      business_profile: { name: null, url: null, mcc: null, product_description: null, ...input.businessProfile },
      capabilities: Object.fromEntries(input.capabilities.map((name) => [name, 'inactive' as const])),
      charges_enabled: false,
      payouts_enabled: false,
      details_submitted: false,
      requirements: {
        ...emptyRequirements(),
        currently_due: [...ONBOARDING_REQUIREMENTS],
        eventually_due: [...ONBOARDING_REQUIREMENTS],
        past_due: [...ONBOARDING_REQUIREMENTS],
        disabled_reason: 'requirements.past_due',
      },
      external_accounts: { object: 'list', data: [], has_more: false, url: `/v1/accounts/${id}/external_accounts` },
      metadata: input.metadata,
      created: this.now(),
      livemode: false,
    };
    this.state.accounts[id] = account;
    return account;
  }

  capabilityObject(account: Account, name: string) {
    return {
      id: name,
      object: 'capability',
      account: account.id,
      requested: true,
      requested_at: account.created,
      status: account.capabilities[name],
      requirements: { ...emptyRequirements(), ...(account.details_submitted ? {} : { currently_due: account.requirements.currently_due }) },
    };
  }

  /** Applies an update to an account and sends account.updated / capability.updated for what changed. */
  updateAccount(
    account: Account,
    change: {
      email?: string;
      metadata?: Metadata;
      businessProfile?: Partial<Account['business_profile']>;
      requestCapabilities?: string[];
    },
  ) {
    const before = clone(account);
    if (change.email !== undefined) account.email = change.email;
    if (change.metadata !== undefined) account.metadata = change.metadata;
    if (change.businessProfile) account.business_profile = { ...account.business_profile, ...change.businessProfile };
    const newCapabilities: string[] = [];
    for (const name of change.requestCapabilities ?? []) {
      if (account.capabilities[name]) continue;
      account.capabilities[name] = account.details_submitted ? 'active' : 'inactive';
      newCapabilities.push(name);
    }
    this.announceAccountChange(before, account, newCapabilities);
  }

  /** What the onboarding page does when the form is submitted. */
  completeOnboarding(account: Account, details: { businessName?: string; routingNumber?: string; accountNumber?: string } = {}) {
    const before = clone(account);
    account.details_submitted = true;
    account.charges_enabled = true;
    account.payouts_enabled = true;
    account.requirements = emptyRequirements();
    if (!account.capabilities.transfers) account.capabilities.transfers = 'inactive';
    for (const name of Object.keys(account.capabilities)) account.capabilities[name] = 'active';
    if (details.businessName) account.business_profile.name = details.businessName;
    if (account.external_accounts.data.length === 0) {
      const number = details.accountNumber || '000123456789';
      account.external_accounts.data.push({
        id: newId('ba_'),
        object: 'bank_account',
        account: account.id,
        bank_name: 'STRIPE TEST BANK',
        country: account.country,
        currency: account.default_currency,
        last4: number.slice(-4),
        routing_number: details.routingNumber || '110000000',
        status: 'new',
        default_for_currency: true,
      });
    }
    this.announceAccountChange(before, account, []);
  }

  private announceAccountChange(before: Account, after: Account, newCapabilities: string[]) {
    const previous: Record<string, unknown> = {};
    for (const key of Object.keys(after) as Array<keyof Account>) {
      if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) previous[key] = before[key];
    }
    if (Object.keys(previous).length === 0) return;
    this.emit('account.updated', after, { account: after.id, previous });
    for (const name of Object.keys(after.capabilities)) {
      if (before.capabilities[name] !== after.capabilities[name] || newCapabilities.includes(name)) {
        this.emit('capability.updated', this.capabilityObject(after, name), {
          account: after.id,
          previous: before.capabilities[name] ? { status: before.capabilities[name] } : {},
        });
      }
    }
  }

  // ── checkout ──────────────────────────────────────────────────────────

  expireIfDue(session: CheckoutSession) {
    if (session.status === 'open' && session.expires_at <= this.now()) this.expireSession(session);
  }

  expireDueSessions(): boolean {
    let changed = false;
    for (const session of Object.values(this.state.checkoutSessions)) {
      if (session.status === 'open' && session.expires_at <= this.now()) {
        this.expireSession(session);
        changed = true;
      }
    }
    return changed;
  }

  expireSession(session: CheckoutSession) {
    if (session.status !== 'open') {
      throw invalidRequest(`Only Checkout Sessions with a status in ["open"] can be expired.`, { code: 'checkout_session_expired' });
    }
    session.status = 'expired';
    session.url = null;
    const intentId = typeof session.payment_intent === 'string' ? session.payment_intent : null;
    const intent = intentId ? this.state.paymentIntents[intentId] : undefined;
    if (intent && intent.status !== 'succeeded' && intent.status !== 'canceled') {
      intent.status = 'canceled';
      intent.next_action = null;
      this.emit('payment_intent.canceled', intent);
    }
    this.emit('checkout.session.expired', session);
  }

  private ensureIntent(session: CheckoutSession): PaymentIntent {
    if (typeof session.payment_intent === 'string') return this.paymentIntent(session.payment_intent);
    const details = this.state.sessionDetails[session.id];
    const id = newId('pi_');
    const intent: PaymentIntent = {
      id,
      object: 'payment_intent',
      amount: session.amount_total,
      amount_capturable: 0,
      amount_received: 0,
      capture_method: 'automatic_async',
      client_secret: `${id}_secret_${newId('', 24)}`,
      confirmation_method: 'automatic',
      created: this.now(),
      currency: session.currency,
      customer: null,
      description: details?.paymentIntentData.description ?? null,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: { ...(details?.paymentIntentData.metadata ?? {}) },
      next_action: null,
      payment_method: null,
      payment_method_types: ['card'],
      receipt_email: details?.paymentIntentData.receipt_email ?? null,
      status: 'requires_payment_method',
      transfer_group: details?.paymentIntentData.transfer_group ?? null,
    };
    this.state.paymentIntents[id] = intent;
    session.payment_intent = id;
    return intent;
  }

  private newCharge(intent: PaymentIntent, card: CardDetails, status: Charge['status'], failure?: LastPaymentError): Charge {
    const charge: Charge = {
      id: newId('ch_'),
      object: 'charge',
      amount: intent.amount,
      amount_captured: status === 'succeeded' ? intent.amount : 0,
      amount_refunded: 0,
      balance_transaction: null,
      billing_details: { email: intent.receipt_email, name: null },
      captured: status === 'succeeded',
      created: this.now(),
      currency: intent.currency,
      description: intent.description,
      failure_code: failure?.code ?? null,
      failure_message: failure?.message ?? null,
      livemode: false,
      metadata: { ...intent.metadata },
      outcome:
        status === 'succeeded'
          ? { network_status: 'approved_by_network', reason: null, risk_level: 'normal', seller_message: 'Payment complete.', type: 'authorized' }
          : {
              network_status: 'declined_by_network',
              reason: failure?.decline_code ?? null,
              risk_level: 'normal',
              seller_message: 'The bank did not return any further details with this decline.',
              type: 'issuer_declined',
            },
      paid: status === 'succeeded',
      payment_intent: intent.id,
      payment_method: intent.payment_method ?? newId('pm_'),
      payment_method_details: { type: 'card', card },
      refunded: false,
      status,
      transfer_group: intent.transfer_group,
    };
    this.state.charges[charge.id] = charge;
    return charge;
  }

  private cardDetails(input: CardInput): CardDetails {
    return { brand: 'visa', country: 'US', exp_month: input.expMonth, exp_year: input.expYear, funding: 'credit', last4: input.number.slice(-4) };
  }

  /** The hosted page's "Pay" button. */
  attemptPayment(session: CheckoutSession, input: CardInput, authenticateUrl: string): PaymentOutcome {
    if (session.status !== 'open') return { kind: 'rejected', message: 'This payment page is no longer open.' };
    const card = TEST_CARDS[input.number as keyof typeof TEST_CARDS];
    if (!card) {
      return {
        kind: 'rejected',
        message: 'Your card number is not one of the test cards this local page accepts. Use 4242 4242 4242 4242 or another listed card.',
      };
    }
    const intent = this.ensureIntent(session);
    intent.payment_method = newId('pm_');
    const details = this.cardDetails(input);
    if (card.outcome === 'success') return this.succeed(session, intent, details);
    if (card.outcome === 'authenticate') {
      intent.status = 'requires_action';
      intent.last_payment_error = null;
      intent.next_action = { type: 'redirect_to_url', redirect_to_url: { url: authenticateUrl, return_url: session.success_url } };
      this.state.sessionDetails[session.id].pendingCard = details;
      return { kind: 'requires_action' };
    }
    const failure: LastPaymentError = { type: 'card_error', code: 'card_declined', decline_code: card.declineCode, message: card.message };
    const charge = this.newCharge(intent, details, 'failed', failure);
    failure.charge = charge.id;
    intent.status = 'requires_payment_method';
    intent.next_action = null;
    intent.latest_charge = charge.id;
    intent.last_payment_error = failure;
    this.emit('charge.failed', charge);
    this.emit('payment_intent.payment_failed', intent);
    return { kind: 'declined', message: card.message, code: 'card_declined', declineCode: card.declineCode };
  }

  /** The 3-D Secure step: approve finishes the payment, fail sends payment_failed. */
  authenticate(session: CheckoutSession, approve: boolean): PaymentOutcome {
    if (session.status !== 'open') return { kind: 'rejected', message: 'This payment page is no longer open.' };
    const intent = typeof session.payment_intent === 'string' ? this.state.paymentIntents[session.payment_intent] : undefined;
    const pendingCard = this.state.sessionDetails[session.id]?.pendingCard;
    if (!intent || intent.status !== 'requires_action' || !pendingCard) {
      return { kind: 'rejected', message: 'There is no payment waiting for authentication. Enter your card again.' };
    }
    delete this.state.sessionDetails[session.id].pendingCard;
    if (approve) return this.succeed(session, intent, pendingCard);
    intent.status = 'requires_payment_method';
    intent.next_action = null;
    intent.last_payment_error = { type: 'invalid_request_error', code: 'payment_intent_authentication_failure', message: AUTHENTICATION_FAILED_MESSAGE };
    this.emit('payment_intent.payment_failed', intent);
    return { kind: 'declined', message: AUTHENTICATION_FAILED_MESSAGE, code: 'payment_intent_authentication_failure' };
  }

  private succeed(session: CheckoutSession, intent: PaymentIntent, card: CardDetails): PaymentOutcome {
    const charge = this.newCharge(intent, card, 'succeeded');
    const txn = this.addBalanceTransaction({
      amount: charge.amount,
      currency: charge.currency,
      type: 'charge',
      source: charge.id,
      availableOn: this.now() + this.settings.fundsAvailableAfterSeconds,
      description: charge.description,
    });
    charge.balance_transaction = txn.id;
    intent.status = 'succeeded';
    intent.amount_received = intent.amount;
    intent.latest_charge = charge.id;
    intent.last_payment_error = null;
    intent.next_action = null;
    session.status = 'complete';
    session.payment_status = 'paid';
    session.url = null;
    session.customer_details = { email: session.customer_email, name: null };
    this.emit('charge.succeeded', charge);
    this.emit('payment_intent.succeeded', intent);
    this.emit('checkout.session.completed', session);
    return { kind: 'succeeded', session };
  }

  // ── refunds ───────────────────────────────────────────────────────────

  createRefund(input: { charge?: string; paymentIntent?: string; amount?: number; reason?: string; metadata: Metadata }): Refund {
    let charge: Charge;
    if (input.charge) {
      charge = this.charge(input.charge, 'charge');
    } else {
      const intent = this.paymentIntent(input.paymentIntent!, 'payment_intent');
      const latest = typeof intent.latest_charge === 'string' ? this.state.charges[intent.latest_charge] : undefined;
      if (intent.status !== 'succeeded' || !latest) {
        throw invalidRequest(`This PaymentIntent (${intent.id}) does not have a successful charge to refund.`, {
          code: 'charge_not_refundable',
          param: 'payment_intent',
        });
      }
      charge = latest;
    }
    if (charge.status !== 'succeeded') {
      throw invalidRequest(`Charge ${charge.id} has not succeeded and cannot be refunded.`, { code: 'charge_not_refundable' });
    }
    const remaining = charge.amount - charge.amount_refunded;
    if (remaining <= 0) {
      throw invalidRequest(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' });
    }
    const amount = input.amount ?? remaining;
    if (amount <= 0) throw invalidParam('amount', 'Refund amount must be positive.');
    if (amount > remaining) {
      throw invalidRequest(
        `Refund amount (${amount}) is greater than unrefunded amount on charge (${remaining}).`,
        { code: 'amount_too_large', param: 'amount' },
      );
    }
    const id = newId('re_');
    const txn = this.addBalanceTransaction({
      amount: -amount,
      currency: charge.currency,
      type: 'refund',
      source: id,
      availableOn: this.chargeAvailableOn(charge),
    });
    const refund: Refund = {
      id,
      object: 'refund',
      amount,
      balance_transaction: txn.id,
      charge: charge.id,
      created: this.now(),
      currency: charge.currency,
      metadata: input.metadata,
      payment_intent: typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent.id,
      reason: input.reason ?? null,
      status: 'succeeded',
    };
    this.state.refunds[id] = refund;
    const previous = { amount_refunded: charge.amount_refunded, refunded: charge.refunded };
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    this.emit('refund.created', refund);
    this.emit('charge.refunded', charge, { previous });
    return refund;
  }

  // ── transfers ─────────────────────────────────────────────────────────

  /** What is still transferable out of a charge: its amount, less refunds, less net transfers. */
  transferableFromCharge(charge: Charge): number {
    const transferred = Object.values(this.state.transfers)
      .filter((t) => t.source_transaction === charge.id)
      .reduce((sum, t) => sum + t.amount - t.amount_reversed, 0);
    return charge.amount - charge.amount_refunded - transferred;
  }

  createTransfer(input: {
    amount: number;
    currency: string;
    destination: string;
    transferGroup?: string;
    sourceTransaction?: string;
    description?: string;
    metadata: Metadata;
  }): Transfer {
    const destination = this.account(input.destination, 'destination');
    if (destination.capabilities.transfers !== 'active') {
      throw invalidRequest(
        'Your destination account needs to have at least one of the following capabilities enabled: transfers, crypto_transfers, legacy_payments',
        { code: 'insufficient_capabilities_for_transfer', param: 'destination' },
      );
    }
    let availableOn = this.now();
    if (input.sourceTransaction) {
      const charge = this.charge(input.sourceTransaction, 'source_transaction');
      if (charge.status !== 'succeeded') {
        throw invalidParam('source_transaction', `The source transaction ${charge.id} has not succeeded.`);
      }
      if (charge.currency !== input.currency) {
        throw invalidParam('currency', `The currency of source_transaction's balance transaction (${charge.currency}) must be the same as the transfer currency (${input.currency}).`);
      }
      const left = this.transferableFromCharge(charge);
      if (input.amount > left) {
        throw invalidRequest(
          `Insufficient funds in the source transaction ${charge.id}: ${left} ${charge.currency} can still be transferred from it (its amount, less refunds and earlier transfers), and this transfer asks for ${input.amount}.`,
          { code: 'balance_insufficient', param: 'amount' },
        );
      }
      availableOn = this.chargeAvailableOn(charge);
    } else {
      const available = this.availableBalance(input.currency);
      if (input.amount > available) {
        throw invalidRequest(
          `You have insufficient available funds in your balance: ${available} ${input.currency} is available and this transfer asks for ${input.amount}. Use source_transaction to transfer from a charge whose funds are still pending.`,
          { code: 'balance_insufficient', param: 'amount' },
        );
      }
    }
    const id = newId('tr_');
    const txn = this.addBalanceTransaction({
      amount: -input.amount,
      currency: input.currency,
      type: 'transfer',
      source: id,
      availableOn,
      description: input.description ?? null,
    });
    const transfer: Transfer = {
      id,
      object: 'transfer',
      amount: input.amount,
      amount_reversed: 0,
      balance_transaction: txn.id,
      created: this.now(),
      currency: input.currency,
      description: input.description ?? null,
      destination: destination.id,
      destination_payment: newId('py_'),
      livemode: false,
      metadata: input.metadata,
      reversals: { object: 'list', data: [], has_more: false, url: `/v1/transfers/${id}/reversals` },
      reversed: false,
      source_transaction: input.sourceTransaction ?? null,
      source_type: 'card',
      transfer_group: input.transferGroup ?? null,
    };
    this.state.transfers[id] = transfer;
    this.emit('transfer.created', transfer);
    return transfer;
  }

  createReversal(transfer: Transfer, input: { amount?: number; description?: string; metadata: Metadata }): TransferReversal {
    const left = transfer.amount - transfer.amount_reversed;
    if (left <= 0) throw invalidRequest(`Transfer ${transfer.id} has already been fully reversed.`, { code: 'transfer_already_reversed' });
    const amount = input.amount ?? left;
    if (amount <= 0) throw invalidParam('amount', 'Reversal amount must be positive.');
    if (amount > left) {
      throw invalidRequest(`Reversal amount (${amount}) is greater than the amount left on transfer ${transfer.id} (${left}).`, {
        code: 'amount_too_large',
        param: 'amount',
      });
    }
    const id = newId('trr_');
    const transferTxnId = typeof transfer.balance_transaction === 'string' ? transfer.balance_transaction : transfer.balance_transaction.id;
    const transferTxn = this.state.balanceTransactions[transferTxnId];
    const txn = this.addBalanceTransaction({
      amount,
      currency: transfer.currency,
      type: 'transfer_refund',
      source: id,
      availableOn: Math.max(this.now(), transferTxn?.available_on ?? 0),
      description: input.description ?? null,
    });
    const reversal: TransferReversal = {
      id,
      object: 'transfer_reversal',
      amount,
      balance_transaction: txn.id,
      created: this.now(),
      currency: transfer.currency,
      destination_payment_refund: newId('pyr_'),
      metadata: input.metadata,
      source_refund: null,
      transfer: transfer.id,
    };
    this.state.reversals[id] = reversal;
    const previous = { amount_reversed: transfer.amount_reversed, reversed: transfer.reversed };
    transfer.amount_reversed += amount;
    transfer.reversed = transfer.amount_reversed === transfer.amount;
    transfer.reversals.data = [reversal, ...transfer.reversals.data].slice(0, 10);
    transfer.reversals.has_more = this.reversalsOf(transfer.id).length > 10;
    this.emit('transfer.reversed', transfer, { previous });
    return reversal;
  }

  reversalsOf(transferId: string): TransferReversal[] {
    return Object.values(this.state.reversals)
      .filter((r) => r.transfer === transferId)
      .reverse();
  }
}
