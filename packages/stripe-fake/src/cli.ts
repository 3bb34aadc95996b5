#!/usr/bin/env node
import { parseCliArgs, USAGE } from './cli-args.js';
import { startStripeFake } from './index.js';

let options;
try {
  options = parseCliArgs(process.argv.slice(2));
} catch (error) {
  console.error(`${(error as Error).message}\n${USAGE}`);
  process.exit(2);
}

try {
  const fake = await startStripeFake(options);
  // The devstack scripts read the first three lines to learn the port, the URL and the signing secret; keep their shape.
  console.log(`Stripe fake listening on ${options.host}:${fake.port}`);
  console.log(`Stripe fake at ${fake.url}`);
  console.log(`Webhook signing secret ${fake.webhookSecret}`);
  console.log(options.webhookUrl ? `Webhooks go to ${options.webhookUrl}` : 'Webhooks are kept until an endpoint is set with PUT /_fake/webhook-endpoint');
  const shutdown = () => {
    fake.stop().then(
      () => process.exit(0),
      () => process.exit(1),
    );
  };
  process.once('SIGINT', shutdown);
  process.once('SIGTERM', shutdown);
} catch (error) {
  console.error((error as Error).message);
  process.exit(1);
}
