import type { BidInput } from '../../shared/schemas/bids';
import { acceptAsRead } from '../../shared/calc/conformance';
import type { InspectionInput, InspectionView } from '../../shared/schemas/inspection';
import type { JobDetail, JobInput } from '../../shared/schemas/jobs';
import type { ShopProfileInput } from '../../shared/schemas/shops';
import { bidInput, jobInput, shopProfileInput, uniformRecordInput } from '../factories';
import type { ApiClient } from './api-session';
import { completeOnboardingPage, payOnPage } from './payments';

/**
 * One person's signed-in API session as the job-state steps drive it: the
 * answer's body, or an error naming the request when it is not a success.
 */
export type Api = <T = any>(method: 'GET' | 'POST' | 'PUT', path: string, data?: unknown) => Promise<T>;

/** The same calls through a supertest session (tests/setup/api-session.ts). */
export function apiOf(client: ApiClient): Api {
  return async (method, path, data = {}) => {
    const res = method === 'GET' ? await client.get(path) : method === 'PUT' ? await client.put(path, data as object) : await client.post(path, data as object);
    if (res.status >= 300) throw new Error(`${method} ${path} answered ${res.status}: ${JSON.stringify(res.body)}`);
    return res.body;
  };
}

/** Asks `check` every 50 ms until it gives something, or fails after `timeoutMs`. */
export async function until<T>(what: string, check: () => Promise<T | undefined | false>, timeoutMs = 8_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/**
 * The states a job goes through, in order; each is reached from the one before
 * it. `completed` and `disputed` both follow `submitted` (the builder accepts
 * the record, or disputes it); `cancelled` is an open job the builder called off.
 */
export const JOB_STATES = ['draft', 'open', 'bid', 'awarded', 'funded', 'inWork', 'submitted', 'completed', 'disputed', 'cancelled'] as const;
export type JobState = (typeof JOB_STATES)[number];

export interface JobStateOptions {
  /** The job, over the factory's (or a whole JobInput). */
  input?: Partial<JobInput>;
  /** Start from this open job of the builder's instead of posting one (e.g. one the form would refuse, put in the database). */
  openJob?: { id: string };
  /** The shop's bid, over the factory's. */
  bid?: Partial<BidInput>;
  /** A shop profile to put first; without it one is put only when the shop has none. */
  shopProfile?: Partial<ShopProfileInput>;
  /** The note on the block-received milestone. */
  receivedNote?: string;
  /** The inspection record the shop submits (default: eight cylinders within the factory job's limits). */
  record?: InspectionInput;
  /** The builder's dispute over the record. */
  dispute?: { reason: string; statement: string };
  /** The card the builder pays with on the stand-in's page. */
  card?: string;
}

export interface JobInStateResult {
  job: JobDetail;
  builder: Api;
  shop?: Api;
  bid?: { id: string; totalCents: number };
  dispute?: { id: string };
}

const order = (state: JobState) => (state === 'cancelled' ? 1.5 : state === 'disputed' ? JOB_STATES.indexOf('completed') : JOB_STATES.indexOf(state));

/**
 * Puts a job into `state` through the app's own API, as its people would:
 * the builder posts (and publishes) it, the shop puts its profile and bids,
 * sets up payouts on the payment stand-in's page, the builder accepts and pays on the
 * stand-in's page (waiting for the signed webhook), the shop logs the block
 * received and submits its record, and the builder accepts or disputes it.
 */
export async function jobInState(state: JobState, people: { builder: Api; shop?: Api }, options: JobStateOptions = {}): Promise<JobInStateResult> {
  const { builder } = people;
  const shop: Api = people.shop ?? (() => Promise.reject(new Error(`a job in state ${state} needs a shop`)));
  const reached = (step: JobState) => order(state) >= order(step);
  const job = options.openJob
    ? (await builder<{ job: JobDetail }>('GET', `/api/jobs/${options.openJob.id}`)).job
    : (await builder<{ job: JobDetail }>('POST', '/api/jobs', jobInput(options.input))).job;
  const result: JobInStateResult = { job, builder, shop: people.shop };
  if (!reached('open')) return result;
  if (!options.openJob) await builder('POST', `/api/jobs/${job.id}/publish`);
  if (state === 'cancelled') {
    await builder('POST', `/api/jobs/${job.id}/cancel`);
    return result;
  }
  if (!reached('bid')) return result;

  const hasProfile = !options.shopProfile && (await shop('GET', '/api/shop-profile').then(() => true, () => false));
  if (!hasProfile) await shop('PUT', '/api/shop-profile', shopProfileInput(options.shopProfile));
  result.bid = (await shop<{ bid: { id: string; totalCents: number } }>('POST', `/api/jobs/${job.id}/bids`, bidInput(options.bid))).bid;
  if (!reached('awarded')) return result;
  // A bid is accepted only from a shop whose payout account is ready: the shop fills in the stand-in's onboarding page.
  if ((await shop<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts !== 'ready') {
    await completeOnboardingPage((await shop<{ url: string }>('POST', '/api/shop-profile/payouts')).url);
    await until('payouts ready', async () => (await shop<{ shop: { payouts: string } }>('GET', '/api/shop-profile')).shop.payouts === 'ready');
  }
  await builder('POST', `/api/bids/${result.bid.id}/accept`);
  if (!reached('funded')) return result;

  const { url: checkout } = await builder<{ url: string }>('POST', `/api/jobs/${job.id}/checkout`);
  const paid = await payOnPage(checkout, options.card ?? '4242424242424242');
  if (paid.status >= 400) throw new Error(`the payment page answered ${paid.status}`);
  await until('funded', async () => (await builder<{ job: JobDetail }>('GET', `/api/jobs/${job.id}`)).job.status === 'funded', 10_000);
  if (!reached('inWork')) return result;
  await shop('POST', `/api/jobs/${job.id}/milestones`, { kind: 'block_received', ...(options.receivedNote === undefined ? {} : { note: options.receivedNote }) });
  if (!reached('submitted')) return result;
  await shop('POST', `/api/jobs/${job.id}/inspection`, options.record ?? uniformRecordInput());
  if (state === 'completed') {
    const { versions } = await builder<InspectionView>('GET', `/api/jobs/${job.id}/inspection`);
    await builder('POST', `/api/jobs/${job.id}/inspection/accept`, acceptAsRead(versions[0]));
  }
  if (state === 'disputed') {
    const opened = options.dispute ?? { reason: 'record_outside_limits', statement: 'Cylinder four measures well over the taper limit on my own gauge.' };
    result.dispute = (await builder<{ dispute: { id: string } }>('POST', `/api/jobs/${job.id}/dispute`, opened)).dispute;
  }
  return result;
}
