export interface CliOptions {
  host: string;
  smtpPort: number;
  httpPort: number;
}

export const USAGE = 'Usage: hitchbook-mail-catcher [--smtp PORT] [--http PORT] [--host HOST]   (ports default to 1025 and 1080; 0 picks a free port)';

/** Returns the options, or throws an Error whose message says which flag was wrong and why. */
export function parseCliArgs(argv: string[]): CliOptions {
  const options: CliOptions = { host: '127.0.0.1', smtpPort: 1025, httpPort: 1080 };
  for (let i = 0; i < argv.length; i += 2) {
    const flag = argv[i]!;
    const value = argv[i + 1];
    if (flag !== '--smtp' && flag !== '--http' && flag !== '--host') throw new Error(`Unknown option ${flag}`);
    if (value === undefined || value.startsWith('--')) throw new Error(`${flag} needs a value`);
    if (flag === '--host') options.host = value;
    else if (flag === '--smtp') options.smtpPort = parsePort(flag, value);
    else options.httpPort = parsePort(flag, value);
  }
  return options;
}

function parsePort(flag: string, value: string): number {
  const port = Number(value);
  if (!/^\d+$/.test(value) || port > 65535) throw new Error(`${flag} must be a port number from 0 to 65535, got "${value}"`);
  return port;
}
