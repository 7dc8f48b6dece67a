/**
 * Runs the payment stand-in on its own:
 *   npx tsx server/dev/payments-stand-in/cli.ts --port 12111 --data .data/payments.json \
 *     [--key sk_test_…] [--webhook-url http://127.0.0.1:3000/api/payments/webhook --webhook-secret whsec_…]
 * Ctrl-C stops it; the state stays in the data file.
 */
import { parseArgs } from 'node:util';
import { DEFAULT_SECRET_KEY, startPaymentsStandIn } from './index';

const { values } = parseArgs({
  options: {
    port: { type: 'string', default: '12111' },
    data: { type: 'string', default: '.data/payments-stand-in.json' },
    key: { type: 'string', default: DEFAULT_SECRET_KEY },
    'webhook-url': { type: 'string' },
    'webhook-secret': { type: 'string' },
    'public-url': { type: 'string' },
  },
});

const webhookUrl = values['webhook-url'];
const webhookSecret = values['webhook-secret'];
if (Boolean(webhookUrl) !== Boolean(webhookSecret)) {
  console.error('Give both --webhook-url and --webhook-secret, or neither.');
  process.exit(2);
}

const standIn = await startPaymentsStandIn({
  port: Number(values.port),
  dataFile: values.data,
  secretKey: values.key,
  publicUrl: values['public-url'],
  webhook: webhookUrl && webhookSecret ? { url: webhookUrl, secret: webhookSecret } : undefined,
  log: (line) => console.log(`[payments] ${line}`),
});
console.log(`[payments] local payment stand-in at ${standIn.url} (data in ${values.data})`);

const stop = () => {
  void standIn.close().then(() => process.exit(0));
};
process.once('SIGINT', stop);
process.once('SIGTERM', stop);
