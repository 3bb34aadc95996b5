import { describe, expect, it } from 'vitest';
import { parseCliArgs } from './cli-args.js';

describe('parseCliArgs', () => {
  it('uses the conventional local ports when given no flags', () => {
    expect(parseCliArgs([])).toEqual({ host: '127.0.0.1', smtpPort: 1025, httpPort: 1080 });
  });

  it('reads every flag', () => {
    expect(parseCliArgs(['--smtp', '0', '--http', '8025', '--host', '0.0.0.0'])).toEqual({ host: '0.0.0.0', smtpPort: 0, httpPort: 8025 });
  });

  it('names the flag when a port is not a port', () => {
    expect(() => parseCliArgs(['--smtp', '70000'])).toThrow('--smtp must be a port number from 0 to 65535, got "70000"');
    expect(() => parseCliArgs(['--http', '-1'])).toThrow('--http must be a port number from 0 to 65535, got "-1"');
  });

  it('rejects an unknown flag and a flag without its value', () => {
    expect(() => parseCliArgs(['--web', '1080'])).toThrow('Unknown option --web');
    expect(() => parseCliArgs(['--smtp', '--http', '1080'])).toThrow('--smtp needs a value');
    expect(() => parseCliArgs(['--host'])).toThrow('--host needs a value');
  });
});
