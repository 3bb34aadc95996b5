#!/usr/bin/env node
// The local PostgreSQL cluster by hand: start | stop | status | url [database].
import { DevstackError } from '../lib/log.mjs';
import { postgresStatus } from '../lib/pg.mjs';
import { appDatabaseUrl, startByHand, stopByHand } from '../lib/pg-session.mjs';
import { installSignalHandlers } from '../lib/proc.mjs';

const USAGE = 'Usage: node packages/devstack/bin/pg.mjs start | stop | status | url [database]   (port: HB_PG_PORT, default 54329)';

async function main([command, database = 'hitchbook', ...extra]) {
  if (extra.length > 0) throw new DevstackError(`unexpected arguments: ${extra.join(' ')}\n${USAGE}`);
  switch (command) {
    case 'start': {
      const outcome = await startByHand();
      console.log(outcome === 'started' ? 'PostgreSQL started; it keeps running until "pg.mjs stop".' : 'PostgreSQL is already running.');
      return 0;
    }
    case 'stop': {
      const { outcome, stillUsing } = await stopByHand();
      if (stillUsing.length > 0) console.error(`! still in use by: ${stillUsing.join(', ')}`);
      console.log(outcome === 'stopped' ? 'PostgreSQL stopped.' : 'PostgreSQL was not running.');
      return 0;
    }
    case 'status': {
      const s = await postgresStatus();
      if (!s.initialised) console.log(`No cluster yet; "start" creates one in ${s.dataDir}.`);
      else if (s.running) console.log(`Running (pid ${s.pid}) on 127.0.0.1:${s.port}, ${s.accepting ? 'accepting connections' : 'not accepting connections yet'}; data ${s.dataDir}, log ${s.log}`);
      else console.log(`Stopped; data ${s.dataDir}, log ${s.log}`);
      return s.running ? 0 : 3;
    }
    case 'url':
      console.log(appDatabaseUrl(database));
      return 0;
    default:
      throw new DevstackError(command ? `unknown command "${command}"\n${USAGE}` : USAGE);
  }
}

installSignalHandlers();
main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (error) => {
    if (error.details) console.error(error.details.trimEnd());
    console.error(`✗ ${error.message}`);
    process.exit(1);
  },
);
