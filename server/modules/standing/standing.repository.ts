import { sql } from 'drizzle-orm';
import { dueDayEnd, dueDayOf } from '../../../shared/due-day';
import type { BuilderStanding, ShopStanding } from '../../../shared/schemas/standing';
import { PAY_WITHIN_DAYS, shareOrNull, STANDING_MIN_COUNT, STANDING_RECENT } from '../../../shared/standing';
import type { Database, Executor } from '../../db/client';

/*
 * Standing, worked out on every read from the rows the events themselves write
 * (bids, milestones, inspection records, disputes, messages, payments), never
 * kept as a summary. Why on read: each figure is then right the moment its
 * event commits, with nothing to keep in step in the six services that cause
 * those events (a stored summary would need an update in each of their
 * transactions, and a missed one would be wrong for good). The queries read a
 * shop's or a builder's own rows through indexes (bids_accepted_shop_idx,
 * milestones_job_idx, inspection_records_version_idx, disputes_job_idx,
 * threads_shop_idx, messages_thread_idx, jobs_builder_awarded_idx,
 * payments_job_idx),
 * so they cost the size of that party's history, not of the tables. A shop's
 * figures read its latest STANDING_RECENT won jobs and conversations, which
 * bounds the cost of a directory page: measured on a page of 20 shops with
 * 500 won jobs and 3,000 messages each (10,000 jobs, 60,000 messages), all
 * history read took about 570 ms (each query ~270 ms, and past the JIT's
 * threshold); the latest 100 of each, 80 to 150 ms (each query ~75 ms), on a
 * 2-core machine shared with other work. A shop page is about 12 ms. A
 * builder's job page reads only their awarded jobs (jobs_builder_awarded_idx):
 * about 20 ms beside 10,000 open jobs of theirs, the bench's shape. The demo
 * data's shops have a few jobs each: a millisecond or two.
 * tests/api/standing.test.ts holds a page of 20 small histories under 250 ms.
 * Should pages of long histories get slow, the next step is a stored summary
 * per shop updated in each event's transaction.
 *
 * The rules (one place, beside their queries):
 * - First-time acceptance: of the shop's won jobs whose first record version
 *   was decided, or disputed while it waited, those accepted at version 1
 *   (by the builder or at the end of the review window).
 * - On time: the job is finished when the shop first logs "ready for pickup"
 *   or "shipped"; it is on time when that day (UTC) is no later than the due
 *   day of shared/due-day.ts (the bid's working days, Monday to Friday, from
 *   the parts' arrival, or from the award until they arrive; holidays are not
 *   known and count as working days). A job paid for with neither entry by
 *   the end of its due day is late, whatever its status (still in the shop,
 *   record sent, accepted or disputed), so no later step takes a late mark
 *   away; an award never paid for, or cancelled, is not counted.
 * - Disputes: every dispute over the shop's won jobs, beside its jobs
 *   completed or decided (the count the minimum applies to), with outcomes.
 * - Answer time: in each conversation, a builder's message that opens it or
 *   follows a shop message starts a wait (further builder messages before an
 *   answer belong to the same wait); the shop's next message ends it, whatever
 *   it says. Clock time, nights and weekends included. Waits not yet answered
 *   are counted as `waiting` and left out of the median.
 * - Pays on time: the award's payment arrived within PAY_WITHIN_DAYS calendar
 *   days of the award; an award left unpaid longer counts as late, also once
 *   cancelled; one cancelled unpaid within those days is not counted.
 * - Answers records: a record version the builder accepted, sent back or
 *   disputed by the end of its review window; counted once decided or once
 *   its window has ended.
 */

const DAY_MS = 86_400_000;
/** Job statuses after the award's payment arrived. */
const PAID_FOR = new Set(['funded', 'in_work', 'inspection_submitted', 'completed', 'disputed', 'resolved']);

const noShopStanding: ShopStanding = { firstTimeAcceptance: null, onTime: null, disputes: null, answerTime: null };
const noBuilderStanding: BuilderStanding = { paysOnTime: null, answersRecords: null };

const uuidList = (ids: string[]) => sql`${sql.param([...new Set(ids)])}::uuid[]`;
const asDate = (value: string | Date | null) => (value === null ? null : new Date(value));

interface WonJobRow extends Record<string, unknown> {
  shop_id: string;
  status: string;
  turnaround_days: number;
  awarded_at: string | Date | null;
  parts_received_at: string | Date | null;
  finished_at: string | Date | null;
  first_record: string | null;
  disputes_opened: number;
  released: number;
  refunded: number;
  split: number;
  undecided: number;
}

/** Each shop's standing, in two queries for any number of shops; a shop with no history has every figure null. */
export async function shopStandings(db: Executor, shopIds: string[], now = new Date()): Promise<Map<string, ShopStanding>> {
  const standings = new Map<string, ShopStanding>(shopIds.map((id) => [id, noShopStanding]));
  if (shopIds.length === 0) return standings;
  const [won, answers] = await Promise.all([
    db.execute<WonJobRow>(sql`
      SELECT s.shop_id, j.status, b.turnaround_days, b.decided_at AS awarded_at,
        (SELECT min(m.created_at) FROM milestones m WHERE m.job_id = j.id AND m.kind = 'block_received') AS parts_received_at,
        (SELECT min(m.created_at) FROM milestones m WHERE m.job_id = j.id AND m.kind IN ('ready_for_pickup', 'shipped')) AS finished_at,
        (SELECT r.status FROM inspection_records r WHERE r.job_id = j.id AND r.version = 1) AS first_record,
        d.opened AS disputes_opened, d.released, d.refunded, d.split, d.undecided
      FROM unnest(${uuidList(shopIds)}) AS s(shop_id)
      CROSS JOIN LATERAL (
        SELECT * FROM bids WHERE bids.shop_id = s.shop_id AND bids.status = 'accepted' ORDER BY bids.decided_at DESC LIMIT ${STANDING_RECENT}
      ) b
      JOIN jobs j ON j.awarded_bid_id = b.id
      CROSS JOIN LATERAL (
        SELECT count(*)::int AS opened,
          count(*) FILTER (WHERE outcome = 'release')::int AS released,
          count(*) FILTER (WHERE outcome = 'refund')::int AS refunded,
          count(*) FILTER (WHERE outcome = 'split')::int AS split,
          count(*) FILTER (WHERE status = 'open')::int AS undecided
        FROM disputes WHERE disputes.job_id = j.id
      ) d`),
    db.execute<{ shop_id: string; answers: number; waiting: number; median_seconds: number | null }>(sql`
      WITH said AS (
        SELECT t.id AS thread_id, t.shop_id, m.created_at,
          m.author_id = j.builder_id AS from_builder,
          lag(m.author_id = j.builder_id) OVER w AS after_builder,
          min(m.created_at) FILTER (WHERE m.author_id = s.user_id) OVER (w ROWS BETWEEN 1 FOLLOWING AND UNBOUNDED FOLLOWING) AS next_shop_at
        FROM shops s
        CROSS JOIN LATERAL (
          SELECT * FROM threads WHERE threads.shop_id = s.id AND threads.last_message_at IS NOT NULL ORDER BY threads.last_message_at DESC LIMIT ${STANDING_RECENT}
        ) t
        JOIN jobs j ON j.id = t.job_id
        JOIN messages m ON m.thread_id = t.id
        WHERE s.id = ANY(${uuidList(shopIds)})
        WINDOW w AS (PARTITION BY t.id ORDER BY m.created_at, m.id)
      )
      SELECT shop_id,
        count(next_shop_at)::int AS answers,
        (count(*) - count(next_shop_at))::int AS waiting,
        percentile_cont(0.5) WITHIN GROUP (ORDER BY extract(epoch FROM next_shop_at - created_at)) AS median_seconds
      FROM said
      WHERE from_builder AND after_builder IS NOT TRUE
      GROUP BY shop_id`),
  ]);

  const tallies = new Map<string, { firstDecided: number; firstAccepted: number; timed: number; onTime: number; completed: number; opened: number; release: number; refund: number; split: number; open: number }>();
  for (const row of won.rows) {
    const t = tallies.get(row.shop_id) ?? { firstDecided: 0, firstAccepted: 0, timed: 0, onTime: 0, completed: 0, opened: 0, release: 0, refund: 0, split: 0, open: 0 };
    tallies.set(row.shop_id, t);
    if (row.first_record && (row.first_record !== 'submitted' || row.status === 'disputed' || row.status === 'resolved')) {
      t.firstDecided += 1;
      if (row.first_record === 'accepted') t.firstAccepted += 1;
    }
    const dueDay = dueDayOf({ turnaroundDays: row.turnaround_days, awardedAt: asDate(row.awarded_at) }, asDate(row.parts_received_at));
    const finishedAt = asDate(row.finished_at);
    if (dueDay && finishedAt) {
      t.timed += 1;
      if (finishedAt.toISOString().slice(0, 10) <= dueDay) t.onTime += 1;
    } else if (dueDay && PAID_FOR.has(row.status) && now > dueDayEnd(dueDay)) {
      t.timed += 1;
    }
    if (row.status === 'completed' || row.status === 'resolved') t.completed += 1;
    t.opened += row.disputes_opened;
    t.release += row.released;
    t.refund += row.refunded;
    t.split += row.split;
    t.open += row.undecided;
  }
  const answerRows = new Map(answers.rows.map((r) => [r.shop_id, r]));
  for (const shopId of standings.keys()) {
    const t = tallies.get(shopId);
    const a = answerRows.get(shopId);
    standings.set(shopId, {
      firstTimeAcceptance: t ? shareOrNull(t.firstAccepted, t.firstDecided) : null,
      onTime: t ? shareOrNull(t.onTime, t.timed) : null,
      disputes:
        t && t.completed >= STANDING_MIN_COUNT
          ? { opened: t.opened, completed: t.completed, outcomes: { release: t.release, refund: t.refund, split: t.split, open: t.open } }
          : null,
      answerTime:
        a && a.answers >= STANDING_MIN_COUNT && a.median_seconds !== null
          ? { minutes: Math.round(Number(a.median_seconds) / 60), of: a.answers, waiting: a.waiting }
          : null,
    });
  }
  return standings;
}

/** Each builder's standing, in one statement for any number of builders. */
type BuilderStandingRow =
  | { kind: 'award'; builder_id: string; awarded_at: string | Date; cancelled_at: string | Date | null; paid_at: string | Date | null; counted: null; answered: null }
  | { kind: 'records'; builder_id: string; awarded_at: null; cancelled_at: null; paid_at: null; counted: number; answered: number };

/** $1: the builders' ids; $2: now. */
const BUILDER_STANDINGS_SQL = `
  SELECT 'award' AS kind, j.builder_id, b.decided_at AS awarded_at, j.cancelled_at,
    (SELECT min(p.paid_at) FROM payments p WHERE p.job_id = j.id AND p.kind = 'bid' AND p.status = 'paid') AS paid_at,
    NULL::int AS counted, NULL::int AS answered
  FROM jobs j
  JOIN bids b ON b.id = j.awarded_bid_id AND b.status = 'accepted'
  WHERE j.builder_id = ANY($1::uuid[]) AND j.awarded_bid_id IS NOT NULL AND b.decided_at IS NOT NULL
  UNION ALL
  SELECT 'records', j.builder_id, NULL, NULL, NULL,
    count(*) FILTER (WHERE r.status <> 'submitted' OR r.review_due_at < $2::timestamptz OR a.answered)::int,
    count(*) FILTER (WHERE a.answered)::int
  FROM inspection_records r
  JOIN jobs j ON j.id = r.job_id
  CROSS JOIN LATERAL (
    SELECT (r.decided_how = 'builder' AND r.decided_at <= r.review_due_at)
      OR EXISTS (SELECT 1 FROM disputes d WHERE d.job_id = r.job_id AND d.opened_side = 'builder' AND d.opened_at >= r.submitted_at AND d.opened_at <= r.review_due_at)
      AS answered
  ) a
  -- Only an awarded job has records; saying so lets the planner take jobs_builder_awarded_idx.
  WHERE j.builder_id = ANY($1::uuid[]) AND j.awarded_bid_id IS NOT NULL
  GROUP BY j.builder_id`;

export async function builderStandings(db: Database, builderIds: string[], now = new Date()): Promise<Map<string, BuilderStanding>> {
  const standings = new Map<string, BuilderStanding>(builderIds.map((id) => [id, noBuilderStanding]));
  if (builderIds.length === 0) return standings;
  // One statement (one connection, one round trip, as the board's page asks for every page): each award's row, then
  // each builder's record tally, told apart by `kind`. Prepared by name on each connection: the board asks it on
  // every page, and planning it each time cost about as much as the board's own statements.
  const { rows } = await db.$client.query<BuilderStandingRow>({ name: 'builder-standings', text: BUILDER_STANDINGS_SQL, values: [[...new Set(builderIds)], now] });
  const awards = rows.filter((row) => row.kind === 'award');
  const records = rows.filter((row) => row.kind === 'records');
  const pay = new Map<string, { of: number; onTime: number }>();
  for (const row of awards) {
    const awardedAt = new Date(row.awarded_at).getTime();
    const limit = awardedAt + PAY_WITHIN_DAYS * DAY_MS;
    const paidAt = asDate(row.paid_at)?.getTime() ?? null;
    const stoppedWaiting = asDate(row.cancelled_at)?.getTime() ?? now.getTime();
    const t = pay.get(row.builder_id) ?? { of: 0, onTime: 0 };
    pay.set(row.builder_id, t);
    if (paidAt !== null) {
      t.of += 1;
      if (paidAt <= limit) t.onTime += 1;
    } else if (stoppedWaiting > limit) {
      t.of += 1;
    }
  }
  const recordRows = new Map(records.map((r) => [r.builder_id, r]));
  for (const builderId of standings.keys()) {
    const p = pay.get(builderId);
    const r = recordRows.get(builderId);
    standings.set(builderId, {
      paysOnTime: p ? shareOrNull(p.onTime, p.of) : null,
      answersRecords: r ? shareOrNull(r.answered, r.counted) : null,
    });
  }
  return standings;
}

/** One shop's standing. */
export async function shopStanding(db: Executor, shopId: string): Promise<ShopStanding> {
  return (await shopStandings(db, [shopId])).get(shopId)!;
}

/** One builder's standing. */
export async function builderStanding(db: Database, builderId: string): Promise<BuilderStanding> {
  return (await builderStandings(db, [builderId])).get(builderId)!;
}
