/**
 * Shapes of the objects the payment stand-in keeps and returns. They follow the
 * provider's v1 objects for the fields this project reads; fields the project
 * never reads are left out rather than faked.
 */

export type Metadata = Record<string, string>;

export interface ListObject<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

export type CapabilityStatus = 'active' | 'inactive' | 'pending';

export interface Requirements {
  currently_due: string[];
  eventually_due: string[];
  past_due: string[];
  pending_verification: string[];
  disabled_reason: string | null;
  current_deadline: number | null;
  errors: unknown[];
}

export interface BankAccount {
  id: string;
  object: 'bank_account';
  account: string;
  bank_name: string;
  country: string;
  currency: string;
  last4: string;
  routing_number: string;
  status: 'new';
  default_for_currency: boolean;
}

export interface Account {
  id: string;
  object: 'account';
  type: string;
  controller: Record<string, unknown> | null;
  country: string;
  default_currency: string;
  email: string | null;
  business_type: string | null;
  business_profile: { name: string | null; url: string | null; mcc: string | null; product_description: string | null };
  capabilities: Record<string, CapabilityStatus>;
  charges_enabled: boolean;
  payouts_enabled: boolean;
  details_submitted: boolean;
  requirements: Requirements;
  external_accounts: ListObject<BankAccount>;
  metadata: Metadata;
  created: number;
  livemode: false;
}

/** An onboarding link as the stand-in remembers it (the token is the page's address). */
export interface AccountLinkGrant {
  token: string;
  account: string;
  type: string;
  refresh_url: string;
  return_url: string;
  created: number;
  expires_at: number;
  used: boolean;
}

export interface LineItem {
  id: string;
  object: 'item';
  amount_discount: number;
  amount_subtotal: number;
  amount_tax: number;
  amount_total: number;
  currency: string;
  description: string;
  price: {
    id: string;
    object: 'price';
    currency: string;
    unit_amount: number;
    product: string;
    type: 'one_time';
    active: boolean;
    livemode: false;
  };
  quantity: number;
}

export interface CheckoutSession {
  id: string;
  object: 'checkout.session';
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer: null;
  customer_details: { email: string | null; name: string | null } | null;
  customer_email: string | null;
  expires_at: number;
  livemode: false;
  locale: string | null;
  metadata: Metadata;
  mode: 'payment';
  payment_intent: string | PaymentIntent | null;
  payment_method_types: string[];
  payment_status: 'unpaid' | 'paid';
  status: 'open' | 'complete' | 'expired';
  success_url: string;
  total_details: { amount_discount: number; amount_shipping: number; amount_tax: number };
  ui_mode: 'hosted';
  url: string | null;
}

/** What a session was created with that the provider does not echo back. */
export interface SessionDetails {
  lineItems: LineItem[];
  paymentIntentData: {
    transfer_group: string | null;
    metadata: Metadata;
    description: string | null;
    receipt_email: string | null;
  };
  /** The card waiting on the 3-D Secure step, if any. */
  pendingCard?: CardDetails;
}

export interface LastPaymentError {
  type: 'card_error' | 'invalid_request_error';
  code: string;
  decline_code?: string;
  message: string;
  charge?: string;
  doc_url?: string;
}

export interface PaymentIntent {
  id: string;
  object: 'payment_intent';
  amount: number;
  amount_capturable: number;
  amount_received: number;
  capture_method: 'automatic' | 'automatic_async';
  client_secret: string;
  confirmation_method: 'automatic';
  created: number;
  currency: string;
  customer: null;
  description: string | null;
  last_payment_error: LastPaymentError | null;
  latest_charge: string | Charge | null;
  livemode: false;
  metadata: Metadata;
  next_action: { type: 'redirect_to_url'; redirect_to_url: { url: string; return_url: string } } | null;
  payment_method: string | null;
  payment_method_types: string[];
  receipt_email: string | null;
  status: 'requires_payment_method' | 'requires_action' | 'succeeded' | 'canceled';
  transfer_group: string | null;
}

export interface CardDetails {
  brand: string;
  country: string;
  exp_month: number;
  exp_year: number;
  funding: string;
  last4: string;
}

export interface Charge {
  id: string;
  object: 'charge';
  amount: number;
  amount_captured: number;
  amount_refunded: number;
  balance_transaction: string | BalanceTransaction | null;
  billing_details: { email: string | null; name: string | null };
  captured: boolean;
  created: number;
  currency: string;
  description: string | null;
  failure_code: string | null;
  failure_message: string | null;
  livemode: false;
  metadata: Metadata;
  outcome: {
    network_status: string;
    reason: string | null;
    risk_level: string;
    seller_message: string;
    type: string;
  };
  paid: boolean;
  payment_intent: string | PaymentIntent;
  payment_method: string;
  payment_method_details: { type: 'card'; card: CardDetails };
  refunded: boolean;
  status: 'succeeded' | 'failed';
  transfer_group: string | null;
}

export interface Refund {
  id: string;
  object: 'refund';
  amount: number;
  balance_transaction: string | BalanceTransaction;
  charge: string | Charge;
  created: number;
  currency: string;
  metadata: Metadata;
  payment_intent: string | PaymentIntent;
  reason: string | null;
  status: 'succeeded';
}

export interface TransferReversal {
  id: string;
  object: 'transfer_reversal';
  amount: number;
  balance_transaction: string | BalanceTransaction;
  created: number;
  currency: string;
  destination_payment_refund: string;
  metadata: Metadata;
  source_refund: null;
  transfer: string | Transfer;
}

export interface Transfer {
  id: string;
  object: 'transfer';
  amount: number;
  amount_reversed: number;
  balance_transaction: string | BalanceTransaction;
  created: number;
  currency: string;
  description: string | null;
  destination: string | Account;
  destination_payment: string;
  livemode: false;
  metadata: Metadata;
  reversals: ListObject<TransferReversal>;
  reversed: boolean;
  source_transaction: string | Charge | null;
  source_type: 'card';
  transfer_group: string | null;
}

export interface BalanceTransaction {
  id: string;
  object: 'balance_transaction';
  amount: number;
  available_on: number;
  created: number;
  currency: string;
  description: string | null;
  fee: number;
  net: number;
  reporting_category: string;
  source: string;
  status: 'available' | 'pending';
  type: 'charge' | 'refund' | 'transfer' | 'transfer_refund';
}

export interface StripeEvent {
  id: string;
  object: 'event';
  account?: string;
  api_version: string;
  created: number;
  data: { object: unknown; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface DeliveryAttempt {
  at: number;
  status?: number;
  error?: string;
}

/** One attempt-series to send one event to the webhook endpoint. */
export interface Delivery {
  id: string;
  eventId: string;
  type: string;
  status: 'pending' | 'delivered' | 'failed';
  /** Held back by the test controls until released. */
  held: boolean;
  /** Position in the sending queue; lower goes first. */
  queueSeq: number;
  attempts: number;
  createdAt: number;
  nextAttemptAt: number;
  deliveredAt: number | null;
  history: DeliveryAttempt[];
}

export interface IdempotencyRecord {
  fingerprint: string;
  method: string;
  path: string;
  status: number;
  body: unknown;
  createdAt: number;
}

export interface DeliveryControls {
  paused: boolean;
  holding: boolean;
  duplicateNext: number;
  reverseNext: { size: number; batch: string[] } | null;
  queueSeq: number;
}

export interface State {
  version: 1;
  accounts: Record<string, Account>;
  accountLinks: Record<string, AccountLinkGrant>;
  checkoutSessions: Record<string, CheckoutSession>;
  sessionDetails: Record<string, SessionDetails>;
  paymentIntents: Record<string, PaymentIntent>;
  charges: Record<string, Charge>;
  refunds: Record<string, Refund>;
  transfers: Record<string, Transfer>;
  reversals: Record<string, TransferReversal>;
  balanceTransactions: Record<string, BalanceTransaction>;
  events: Record<string, StripeEvent>;
  idempotency: Record<string, IdempotencyRecord>;
  deliveries: Record<string, Delivery>;
  webhook: { url: string; secret: string } | null;
  delivery: DeliveryControls;
}
