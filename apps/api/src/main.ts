import 'reflect-metadata';
import { createApp } from './app.factory.js';
import { loadConfig } from './core/config.js';

let config;
try {
  config = loadConfig();
} catch (err) {
  console.error(`Hitchbook API cannot start: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
}
const app = await createApp(config);
app.enableShutdownHooks();
await app.listen(config.port, process.env.HOST ?? '127.0.0.1');
console.log(`Hitchbook API listening on ${config.appUrl}`);
