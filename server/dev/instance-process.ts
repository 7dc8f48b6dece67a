/**
 * One app instance in a process of its own, as a deployment runs several
 * (server/dev/cluster.ts forks it for `npm run start:cluster`, the cross-instance
 * test and the realtime bench). It reads the app's settings from
 * TENTHMARK_INSTANCE_ENV (JSON), serves the built browser app when
 * TENTHMARK_CLIENT_DIR is among them, never migrates (whoever starts the
 * instances migrates once), and talks to its parent over the IPC channel:
 * it answers `{ listening: { host, port } }` once it listens, `{ clients }` to
 * `count`, `{ ran }` to `run-due` (the scheduler's due tasks at `now`), and closes
 * and exits on `close` or when the parent goes away.
 */
import { loadConfig } from '../env';
import { startServer } from '../runtime';

export type InstanceAsk = { ask: 'count' } | { ask: 'close' } | { ask: 'run-due'; now?: string };
export type InstanceAnswer = { listening: { host: string; port: number } } | { clients: number } | { ran: number } | { failed: string };

const send = (answer: InstanceAnswer) => process.send?.(answer);

const config = loadConfig(JSON.parse(process.env.TENTHMARK_INSTANCE_ENV ?? '{}') as Record<string, string>);
const running = await startServer(config, { migrate: false, client: config.clientDir ? { kind: 'static', dir: config.clientDir } : undefined });
let closing: Promise<void> | undefined;
const closeAndExit = () => (closing ??= running.close().finally(() => process.exit(0)));
process.on('message', (message: InstanceAsk) => {
  if (message.ask === 'count') send({ clients: running.io.engine.clientsCount });
  if (message.ask === 'close') void closeAndExit();
  if (message.ask === 'run-due') {
    void running.scheduler.runDue(message.now ? new Date(message.now) : undefined).then(
      (ran) => send({ ran }),
      (error: unknown) => send({ failed: String(error) }),
    );
  }
});
// The parent went away without asking: nothing is left running.
process.on('disconnect', () => void closeAndExit());
// A terminal's Ctrl-C reaches the whole process group, this process too: while the parent is
// there, it closes the instances in its own order (before stopping PostgreSQL); on its own, a
// signal closes this instance.
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
  process.on(signal, () => {
    if (!process.connected) void closeAndExit();
  });
}
// The parent may have gone while this was starting (its 'disconnect' then came before the listener above).
if (process.connected) send({ listening: { host: config.host, port: running.port } });
else void closeAndExit();
