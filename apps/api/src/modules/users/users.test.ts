import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signIn, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { tokenFromLink, waitForMail } from '../../test-support/mailbox.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  tokens = await signInAll(t, fx);
});
afterAll(() => t.close());

describe('members and invitations', () => {
  it('lists members for the owner and the bookkeeper only', async () => {
    const res = await t.http().get('/api/users').set(bearer(tokens.owner));
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(6);
    expect(res.body.items.map((m: { role: string }) => m.role).sort()).toEqual(['bookkeeper', 'customer', 'customer', 'operator', 'owner', 'partner']);
    expect((await t.http().get('/api/users').set(bearer(tokens.bookkeeper))).status).toBe(200);
    for (const role of ['partner', 'operator', 'customer'] as const) {
      expect((await t.http().get('/api/users').set(bearer(tokens[role]))).status).toBe(403);
    }
  });

  it('e-mails an invitation whose link lets the person choose a password and sign in', async () => {
    const email = `new-hand-${Date.now()}@example.test`;
    const invited = await t.http().post('/api/users/invitations').set(bearer(tokens.owner)).send({ email, name: 'New Hand', role: 'operator' });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({ email, role: 'operator', status: 'invited' });

    const mail = await waitForMail(email, 'invited you');
    const token = tokenFromLink(mail, '/accept-invite');
    const info = await t.http().get(`/api/auth/invitations/${token}`);
    expect(info.status).toBe(200);
    expect(info.body).toMatchObject({ email, role: 'operator' });

    // An invited person cannot sign in before accepting.
    expect((await t.http().post('/api/auth/login').send({ email, password: 'whatever-password' })).status).toBe(401);
    const accepted = await t.http().post('/api/auth/invitations/accept').send({ token, name: 'Nora Hand', password: 'a-new-secret-phrase' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email, name: 'Nora Hand', role: 'operator', operationId: fx.operationId });
    // The link is single-use.
    expect((await t.http().post('/api/auth/invitations/accept').send({ token, name: 'Again', password: 'a-new-secret-phrase' })).status).toBe(400);
    expect((await signIn(t, email, 'a-new-secret-phrase')).token).toBeTruthy();
  });

  it('refuses a customer invitation without a customer party, and a household for a customer', async () => {
    const noParty = await t.http().post('/api/users/invitations').set(bearer(tokens.owner)).send({ email: 'c1@example.test', name: 'C', role: 'customer' });
    expect(noParty.status).toBe(400);
    expect(noParty.body.issues[0].path).toBe('partyId');
    const household = await t.http().post('/api/users/invitations').set(bearer(tokens.owner)).send({ email: 'c2@example.test', name: 'C', role: 'customer', partyId: fx.households[0] });
    expect(household.status).toBe(400);
    expect(household.body.issues[0].path).toBe('partyId');
  });

  it('refuses header injection in names and addresses', async () => {
    const res = await t.http().post('/api/users/invitations').set(bearer(tokens.owner)).send({ email: 'x@example.test\r\nBcc: all@example.test', name: 'Evil\r\nBcc: y@example.test', role: 'operator' });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'name']);
  });

  it('refuses a second sign-in for an address that has one (409)', async () => {
    const res = await t.http().post('/api/users/invitations').set(bearer(tokens.owner)).send({ email: fx.members.partner.email, name: 'Dup', role: 'operator' });
    expect(res.status).toBe(409);
  });

  it('keeps at least one owner', async () => {
    const res = await t.http().patch(`/api/users/${fx.members.owner.membershipId}`).set(bearer(tokens.owner)).send({ role: 'partner' });
    expect(res.status).toBe(409);
  });

  it('changes a role and removes a member, ending their sessions', async () => {
    const local = await createOperation(t.dbh.db, 'Roles');
    const owner = (await signIn(t, local.members.owner.email)).token;
    const operator = (await signIn(t, local.members.operator.email)).token;
    const changed = await t.http().patch(`/api/users/${local.members.operator.membershipId}`).set(bearer(owner)).send({ role: 'partner', partyId: local.households[1] });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ role: 'partner', partyId: local.households[1] });
    expect((await t.http().get('/api/auth/me').set(bearer(operator))).body.role).toBe('partner');
    expect((await t.http().delete(`/api/users/${local.members.operator.membershipId}`).set(bearer(owner))).status).toBe(204);
    expect((await t.http().get('/api/auth/me').set(bearer(operator))).status).toBe(401);
  });

  it("answers 404 for another operation's member and changes nothing", async () => {
    const other = await createOperation(t.dbh.db, 'Other');
    const res = await t.http().patch(`/api/users/${other.members.partner.membershipId}`).set(bearer(tokens.owner)).send({ role: 'operator' });
    expect(res.status).toBe(404);
    const del = await t.http().delete(`/api/users/${other.members.partner.membershipId}`).set(bearer(tokens.owner));
    expect(del.status).toBe(404);
    const otherOwner = (await signIn(t, other.members.owner.email)).token;
    const list = await t.http().get('/api/users').set(bearer(otherOwner));
    expect(list.body.items.find((m: { membershipId: string }) => m.membershipId === other.members.partner.membershipId).role).toBe('partner');
  });

  it('sends a password-reset link that works once and gives the same answer for unknown addresses', async () => {
    const local = await createOperation(t.dbh.db, 'Reset');
    const email = local.members.bookkeeper.email;
    const known = await t.http().post('/api/auth/password-reset/request').send({ email });
    const unknown = await t.http().post('/api/auth/password-reset/request').send({ email: 'nobody-here@example.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(known.body).toEqual(unknown.body);
    const token = tokenFromLink(await waitForMail(email, 'Reset your Hitchbook password'), '/reset-password');
    expect((await t.http().post('/api/auth/password-reset/confirm').send({ token, password: 'reset-to-this-one' })).status).toBe(204);
    expect((await t.http().post('/api/auth/password-reset/confirm').send({ token, password: 'reset-to-this-one' })).status).toBe(400);
    expect((await signIn(t, email, 'reset-to-this-one')).token).toBeTruthy();
  });
});
