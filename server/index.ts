import { fileURLToPath } from 'node:url';
import { loadConfig } from './env';
import { startServer } from './runtime';

/**
 * Production entry: expects PostgreSQL and SMTP to be reachable at the
 * configured addresses and the browser app built into dist/client.
 * For a machine with nothing set up, use `npm start` (server/dev/start.ts).
 */
const config = loadConfig();
const running = await startServer(config, {
  client: { kind: 'static', dir: fileURLToPath(new URL('../dist/client', import.meta.url)) },
});
console.log(`Tenthmark listening on ${config.appUrl} (port ${running.port})`);

for (const signal of ['SIGINT', 'SIGTERM'] as const) {
  process.once(signal, () => {
    void running.close().then(() => process.exit(0));
  });
}
