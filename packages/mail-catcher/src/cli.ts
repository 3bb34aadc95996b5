#!/usr/bin/env node
import { parseCliArgs, USAGE } from './cli-args.js';
import { startMailCatcher } from './index.js';

let options;
try {
  options = parseCliArgs(process.argv.slice(2));
} catch (error) {
  console.error(`${(error as Error).message}\n${USAGE}`);
  process.exit(2);
}

try {
  const catcher = await startMailCatcher(options);
  // The devstack scripts read these two lines to learn the bound ports; keep their shape.
  console.log(`SMTP listening on ${options.host}:${catcher.smtpPort}`);
  console.log(`Web inbox at http://${options.host}:${catcher.httpPort}/`);
  const shutdown = () => {
    catcher.stop().then(
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
