/**
 * One app instance in a process of its own, for benches that start several
 * (as a deployment runs them). Started with fork(): it reads the app's
 * configuration from BENCH_INSTANCE_ENV (JSON), answers `{ url }` once it
 * listens, `{ clients }` when asked `count`, and closes and exits when asked `close`.
 */
import { loadConfig } from '../../server/env';
import { startServer } from '../../server/runtime';

const running = await startServer(loadConfig(JSON.parse(process.env.BENCH_INSTANCE_ENV ?? '{}') as Record<string, string>), { migrate: false });
process.on('message', (ask: 'count' | 'close') => {
  if (ask === 'count') process.send?.({ clients: running.io.engine.clientsCount });
  if (ask === 'close') void running.close().then(() => process.exit(0));
});
// The bench went away without asking: nothing is left running.
process.on('disconnect', () => void running.close().finally(() => process.exit(0)));
process.send?.({ url: running.url });
