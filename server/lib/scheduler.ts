import { sql } from 'drizzle-orm';
import type { Logger } from 'pino';
import type { Database, Executor } from '../db/client';
import { scheduledTasks } from '../db/schema';

export type TaskHandler = (payload: Record<string, unknown>, now: Date) => Promise<void>;

/** Schedules work for later; the same key is scheduled once, however often this is called. */
export async function scheduleTask(db: Executor, task: { kind: string; key: string; payload: Record<string, unknown>; runAt: Date }) {
  await db.insert(scheduledTasks).values(task).onConflictDoNothing({ target: scheduledTasks.key });
}

/**
 * A task that comes back every `everyMs`, on the same leased rows as one-off
 * tasks. Each run is keyed by its time slot, so however many instances
 * schedule it, a slot is scheduled once and (leased like any task) runs once;
 * each run schedules the slot after its own `now`. `schedule` at start-up puts
 * in the current slot's run, which is nothing when another instance already has.
 */
export function recurringTask(options: { db: Database; kind: string; everyMs: number; run: (now: Date) => Promise<void> }) {
  const { db, kind, everyMs } = options;
  const slotOf = (time: Date) => Math.floor(time.getTime() / everyMs) * everyMs;
  const scheduleSlot = (slot: number, runAt: Date) => scheduleTask(db, { kind, key: `${kind}@${new Date(slot).toISOString()}`, payload: {}, runAt });
  return {
    schedule: (now: Date = new Date()) => scheduleSlot(slotOf(now), now),
    handlers: {
      [kind]: async (_payload: Record<string, unknown>, now: Date) => {
        await options.run(now);
        const next = slotOf(now) + everyMs;
        await scheduleSlot(next, new Date(next));
      },
    } satisfies Record<string, TaskHandler>,
  };
}

/**
 * Runs due tasks. Each is leased with FOR UPDATE SKIP LOCKED before it runs,
 * so two instances never run the same task at once; a task whose worker died
 * mid-way is leased again when its lease ends. `now` can be given, so tests
 * move the clock instead of waiting days.
 */
export function createScheduler(options: { db: Database; handlers: Record<string, TaskHandler>; leaseMs?: number; logger?: Logger }) {
  const leaseMs = options.leaseMs ?? 5 * 60_000;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<number> | undefined;

  async function claim(now: Date) {
    const at = now.toISOString();
    const result = await options.db.execute<{ id: string; kind: string; payload: Record<string, unknown> }>(sql`
      UPDATE scheduled_tasks SET leased_until = ${at}::timestamptz + ${leaseMs} * interval '1 millisecond', attempts = attempts + 1
      WHERE id = (
        SELECT id FROM scheduled_tasks
        WHERE done_at IS NULL AND run_at <= ${at}::timestamptz AND (leased_until IS NULL OR leased_until < ${at}::timestamptz)
        ORDER BY run_at LIMIT 1
        FOR UPDATE SKIP LOCKED)
      RETURNING id, kind, payload`);
    return result.rows[0];
  }

  async function runDue(now: Date = new Date()): Promise<number> {
    let ran = 0;
    for (let task = await claim(now); task; task = await claim(now)) {
      const handler = options.handlers[task.kind];
      try {
        if (!handler) throw new Error(`no handler for task kind ${task.kind}`);
        await handler(task.payload, now);
        await options.db.execute(sql`UPDATE scheduled_tasks SET done_at = now(), last_error = NULL WHERE id = ${task.id}`);
      } catch (error) {
        options.logger?.warn({ err: error, task: task.id }, 'scheduled task failed; it runs again when its lease ends');
        await options.db.execute(sql`UPDATE scheduled_tasks SET last_error = ${String(error).slice(0, 500)} WHERE id = ${task.id}`);
      }
      ran += 1;
    }
    return ran;
  }

  return {
    runDue,
    start(intervalMs = 30_000) {
      timer = setInterval(() => {
        running ??= runDue()
          .catch(() => 0)
          .finally(() => {
            running = undefined;
          });
      }, intervalMs);
      timer.unref();
    },
    async stop() {
      if (timer) clearInterval(timer);
      await running;
    },
  };
}

export type Scheduler = ReturnType<typeof createScheduler>;
