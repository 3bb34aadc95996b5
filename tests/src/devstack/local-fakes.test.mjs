import { connect } from 'node:net';
import { existsSync } from 'node:fs';
import { afterEach, describe, expect, it } from 'vitest';
import { localFakes, startLocalFakes } from '../../../packages/devstack/lib/local-fakes.mjs';
import { inRepo } from '../../../packages/devstack/lib/paths.mjs';

const mail = localFakes.find((f) => f.name === 'mail catcher');

function smtpGreeting(host, port) {
  return new Promise((resolve, reject) => {
    const socket = connect(Number(port), host);
    socket.setEncoding('utf8');
    socket.once('data', (line) => {
      socket.end('QUIT\r\n');
      resolve(line);
    });
    socket.once('error', reject);
  });
}

describe('mail catcher as a local fake', () => {
  it('reads the bound ports from the lines its CLI prints', () => {
    expect(mail.readyFrom(['SMTP listening on 127.0.0.1:40125'])).toBeNull();
    const values = mail.readyFrom(['SMTP listening on 127.0.0.1:40125', 'Web inbox at http://127.0.0.1:40180/']);
    expect(mail.env(values)).toMatchObject({
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: '40125',
      MAIL_API_URL: 'http://127.0.0.1:40180',
      MAIL_WEB_URL: 'http://127.0.0.1:40180',
    });
  });

  describe.runIf(existsSync(inRepo(mail.entry)))('started from the build', () => {
    let running;
    afterEach(async () => {
      await Promise.all((running?.services ?? []).map((s) => s.stop()));
    });

    it('hands out an SMTP port that greets and an inbox API that answers', async () => {
      running = await startLocalFakes({ fixedPorts: false });
      expect(await smtpGreeting(running.env.SMTP_HOST, running.env.SMTP_PORT)).toMatch(/^220 .*Hitchbook mail catcher/);
      const res = await fetch(`${running.env.MAIL_API_URL}/api/messages`);
      expect(res.status).toBe(200);
      expect(Array.isArray(await res.json())).toBe(true);
    });
  });
});
