import { createHmac, createSign, generateKeyPairSync } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { memberships } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, FIXTURE_PASSWORD, signIn, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { hashPassword } from './passwords.js';

let t: TestApp;
let fx: OperationFixture;
const CSRF = { 'X-Requested-With': 'hitchbook' };

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
});
afterAll(() => t.close());

function b64url(obj: object): string {
  return Buffer.from(JSON.stringify(obj)).toString('base64url');
}

function forge(payload: object, secret: string, header: object = { alg: 'HS256', typ: 'JWT' }): string {
  const head = `${b64url(header)}.${b64url(payload)}`;
  return `${head}.${createHmac('sha256', secret).update(head).digest('base64url')}`;
}

describe('sign-in', () => {
  it('returns an access token, the member and an httpOnly SameSite=Strict refresh cookie', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: fx.members.partner.email, password: FIXTURE_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: fx.members.partner.email, role: 'partner', operationId: fx.operationId, partyId: fx.households[1] });
    expect(res.body.expiresIn).toBeLessThanOrEqual(15 * 60);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).join(';');
    expect(cookie).toMatch(/hb_refresh=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Strict/i);
    expect(cookie).toMatch(/Path=\/api\/auth/);
  });

  it('gives the same 401 body for a wrong password and an unknown e-mail', async () => {
    const wrong = await t.http().post('/api/auth/login').send({ email: fx.members.bookkeeper.email, password: 'not-the-password' });
    const unknown = await t.http().post('/api/auth/login').send({ email: 'nobody-at-all@example.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body).toEqual({ message: 'Wrong e-mail or password.' });
  });

  it('is case-insensitive in the e-mail address', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: fx.members.owner.email.toUpperCase(), password: FIXTURE_PASSWORD });
    expect(res.status).toBe(200);
  });

  it('names the fields at fault for a malformed request', async () => {
    const res = await t.http().post('/api/auth/login').send({ email: 'not-an-email', role: 'owner' });
    expect(res.status).toBe(400);
    const paths = (res.body.issues as Array<{ path: string }>).map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['email', 'password', 'role']));
  });

  it('throttles an account after ten failures with 429, even for the right password', async () => {
    const fresh = await createOperation(t.dbh.db, 'Throttle');
    const email = fresh.members.operator.email;
    for (let i = 0; i < 10; i++) {
      const res = await t.http().post('/api/auth/login').send({ email, password: `wrong-${i}-password` });
      expect(res.status).toBe(401);
    }
    const blocked = await t.http().post('/api/auth/login').send({ email, password: FIXTURE_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // Another account is not affected by this one's lock.
    expect((await t.http().post('/api/auth/login').send({ email: fresh.members.owner.email, password: FIXTURE_PASSWORD })).status).toBe(200);
  });

  it('hashes new passwords with bcrypt cost 12 at the product setting', async () => {
    const hash = await hashPassword('a-long-enough-password', 12);
    expect(hash).toMatch(/^\$2[aby]\$12\$/);
  });
});

describe('access tokens', () => {
  it('lets /me answer for a valid token and refuses a missing one', async () => {
    const { token } = await signIn(t, fx.members.owner.email);
    const me = await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}`);
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({ email: fx.members.owner.email, role: 'owner' });
    expect((await t.http().get('/api/auth/me')).status).toBe(401);
  });

  it('refuses tampered, alg:none, wrong-audience, wrong-secret and expired tokens', async () => {
    const { token } = await signIn(t, fx.members.owner.email);
    const [h, p] = token.split('.') as [string, string, string];
    const claims = JSON.parse(Buffer.from(p, 'base64url').toString()) as Record<string, unknown>;
    const now = Math.floor(Date.now() / 1000);
    const bad = [
      `${h}.${b64url({ ...claims, sub: fx.members.partner.userId })}.${token.split('.')[2]}`,
      `${b64url({ alg: 'none', typ: 'JWT' })}.${p}.`,
      forge({ ...claims, aud: 'someone-else' }, t.config.jwtSecret),
      forge(claims, 'another-secret-of-sufficient-length-0123456789'),
      forge({ ...claims, iat: now - 3600, exp: now - 60 }, t.config.jwtSecret),
      forge({ ...claims, typ: 'refresh' }, t.config.jwtSecret),
    ];
    for (const candidate of bad) {
      const res = await t.http().get('/api/auth/me').set('Authorization', `Bearer ${candidate}`);
      expect(res.status).toBe(401);
    }
    // The forging helper itself is sound: the same claims with the right secret pass.
    const ok = await t.http().get('/api/auth/me').set('Authorization', `Bearer ${forge(claims, t.config.jwtSecret)}`);
    expect(ok.status).toBe(200);
  });

  it('refuses a wrong issuer, a future nbf and any algorithm but HS256, even signed with the real secret', async () => {
    const { token } = await signIn(t, fx.members.owner.email);
    const claims = JSON.parse(Buffer.from(token.split('.')[1]!, 'base64url').toString()) as Record<string, unknown>;
    const now = Math.floor(Date.now() / 1000);
    const hs512 = (() => {
      const head = `${b64url({ alg: 'HS512', typ: 'JWT' })}.${b64url(claims)}`;
      return `${head}.${createHmac('sha512', t.config.jwtSecret).update(head).digest('base64url')}`;
    })();
    // RS/HS confusion: a token signed with a key pair of the attacker's, announcing RS256.
    const rs256 = (() => {
      const { privateKey } = generateKeyPairSync('rsa', { modulusLength: 2048 });
      const head = `${b64url({ alg: 'RS256', typ: 'JWT' })}.${b64url(claims)}`;
      return `${head}.${createSign('RSA-SHA256').update(head).sign(privateKey).toString('base64url')}`;
    })();
    const bad = {
      issuer: forge({ ...claims, iss: 'someone-else' }, t.config.jwtSecret),
      notYet: forge({ ...claims, nbf: now + 3600 }, t.config.jwtSecret),
      hs512,
      rs256,
      noneUpper: `${b64url({ alg: 'NONE', typ: 'JWT' })}.${b64url(claims)}.`,
    };
    for (const [name, candidate] of Object.entries(bad)) {
      const res = await t.http().get('/api/auth/me').set('Authorization', `Bearer ${candidate}`);
      expect(res.status, name).toBe(401);
    }
    // A write route refuses them too, before its handler runs: nothing is created.
    const parties = await t.dbh.db.query.parties.findMany({ where: (p, { eq }) => eq(p.operationId, fx.operationId) });
    for (const candidate of Object.values(bad)) {
      const res = await t.http().post('/api/parties').set('Authorization', `Bearer ${candidate}`).send({ kind: 'customer', name: 'Forged neighbour', relationship: 'neighbour' });
      expect(res.status).toBe(401);
    }
    expect(await t.dbh.db.query.parties.findMany({ where: (p, { eq }) => eq(p.operationId, fx.operationId) })).toHaveLength(parties.length);
  });

  it('takes a removed membership away on the next request', async () => {
    const fresh = await createOperation(t.dbh.db, 'Removal');
    const { token } = await signIn(t, fresh.members.bookkeeper.email);
    expect((await t.http().get('/api/dashboard').set('Authorization', `Bearer ${token}`)).status).toBe(200);
    await t.dbh.db.delete(memberships).where(eq(memberships.id, fresh.members.bookkeeper.membershipId));
    expect((await t.http().get('/api/dashboard').set('Authorization', `Bearer ${token}`)).status).toBe(401);
  });

  it('applies a role change on the next request', async () => {
    const fresh = await createOperation(t.dbh.db, 'Demotion');
    const { token } = await signIn(t, fresh.members.partner.email);
    const auth = { Authorization: `Bearer ${token}` };
    expect((await t.http().post('/api/parties').set(auth).send({ kind: 'customer', name: 'New neighbour', relationship: 'neighbour' })).status).toBe(201);
    await t.dbh.db.update(memberships).set({ role: 'operator' }).where(eq(memberships.id, fresh.members.partner.membershipId));
    expect((await t.http().post('/api/parties').set(auth).send({ kind: 'customer', name: 'Another', relationship: 'neighbour' })).status).toBe(403);
  });
});

describe('refresh tokens', () => {
  it('rotates on every use and needs the app header', async () => {
    const { cookie } = await signIn(t, fx.members.owner.email);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', cookie)).status).toBe(403);
    const first = await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF);
    expect(first.status).toBe(200);
    expect(first.body.user.email).toBe(fx.members.owner.email);
    const next = (first.headers['set-cookie'] as unknown as string[])[0]!.split(';')[0]!;
    expect(next).not.toBe(cookie);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', next).set(CSRF)).status).toBe(200);
  });

  it('refuses a cross-site Origin', async () => {
    const { cookie } = await signIn(t, fx.members.owner.email);
    const res = await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF).set('Origin', 'https://evil.example');
    expect(res.status).toBe(403);
  });

  it('revokes the whole session when a used refresh token comes back', async () => {
    const { cookie, token } = await signIn(t, fx.members.partner.email);
    const rotated = await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF);
    const newCookie = (rotated.headers['set-cookie'] as unknown as string[])[0]!.split(';')[0]!;
    const replay = await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF);
    expect(replay.status).toBe(401);
    // The legitimate holder's newer token and the session's access tokens are dead too.
    expect((await t.http().post('/api/auth/refresh').set('Cookie', newCookie).set(CSRF)).status).toBe(401);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${rotated.body.accessToken}`)).status).toBe(401);
  });

  it('logout revokes the session for the next request', async () => {
    const { cookie, token } = await signIn(t, fx.members.owner.email);
    expect((await t.http().post('/api/auth/logout').set('Cookie', cookie).set(CSRF)).status).toBe(204);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF)).status).toBe(401);
  });
});

describe('password change', () => {
  it('requires the current password, refuses over 72 bytes, and ends the other sessions', async () => {
    const fresh = await createOperation(t.dbh.db, 'Password');
    const email = fresh.members.owner.email;
    const phone = await signIn(t, email);
    const laptop = await signIn(t, email);
    const auth = { Authorization: `Bearer ${laptop.token}` };

    const wrong = await t.http().post('/api/auth/password').set(auth).send({ currentPassword: 'nope-nope', newPassword: 'brand-new-password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.issues[0].path).toBe('currentPassword');

    const tooLong = await t.http().post('/api/auth/password').set(auth).send({ currentPassword: FIXTURE_PASSWORD, newPassword: 'é'.repeat(40) });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.issues[0].path).toBe('newPassword');

    const short = await t.http().post('/api/auth/password').set(auth).send({ currentPassword: FIXTURE_PASSWORD, newPassword: 'short' });
    expect(short.status).toBe(400);

    const ok = await t.http().post('/api/auth/password').set(auth).send({ currentPassword: FIXTURE_PASSWORD, newPassword: 'brand-new-password' });
    expect(ok.status).toBe(204);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${phone.token}`)).status).toBe(401);
    expect((await t.http().get('/api/auth/me').set(auth)).status).toBe(200);
    expect((await t.http().post('/api/auth/login').send({ email, password: FIXTURE_PASSWORD })).status).toBe(401);
    expect((await t.http().post('/api/auth/login').send({ email, password: 'brand-new-password' })).status).toBe(200);
  });
});
