import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, makeBlock, makeMember, makeTeam, PASSWORD, testDb } from '../helpers/fixtures';
import { Client } from '../helpers/http';
import { mailsTo, waitForMail } from '../helpers/mail';

afterAll(closeTestDb);

type Team = Awaited<ReturnType<typeof makeTeam>>;
let team: Team;
let block: { id: string };
const as: Record<'manager' | 'scout' | 'pruner' | 'advisor', Client> = {} as never;

beforeAll(async () => {
  team = await makeTeam();
  block = await makeBlock(team.org.id, { rows: 3, vinesPerRow: 10 });
  for (const role of ['manager', 'scout', 'pruner', 'advisor'] as const) {
    as[role] = new Client();
    await as[role].signIn(team[role].email, PASSWORD);
  }
});

async function finding(client: Client, row = 2, position = 4) {
  const id = randomUUID();
  const res = await client.json('/api/sync', 'POST', {
    observations: [
      {
        id,
        blockId: block.id,
        row,
        position,
        kind: 'trunk-injury',
        data: { cause: 'mechanical', severity: 'moderate', girdlingPercent: 20 },
        note: '',
        observedAt: '2026-11-02T09:00:00Z',
      },
    ],
  });
  expect((await res.json()).results[0].status).toBe('created');
  return id;
}

const comment = (client: Client, subject: string, subjectId: string, body: string) => client.json('/api/comments', 'POST', { subject, subjectId, body });

/** Waits for mail to settle: the worker polls every two seconds, so three quiet seconds mean nothing more is coming. */
const settle = () => new Promise((r) => setTimeout(r, 3500));

describe('roles table: comment on findings', () => {
  it.each(['manager', 'advisor'] as const)('lets a %s comment on anyone’s finding', async (role) => {
    const id = await finding(as.scout);
    const res = await comment(as[role], 'observation', id, 'Worth a look before pruning.');
    expect(res.status).toBe(201);
  });

  it.each(['scout', 'pruner'] as const)('lets a %s comment on their own finding but not on one they have no part in', async (role) => {
    const own = await finding(as[role]);
    expect((await comment(as[role], 'observation', own, 'Photo to follow.')).status).toBe(201);
    const others = await finding(role === 'scout' ? as.pruner : as.scout);
    const res = await comment(as[role], 'observation', others, 'Me too');
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe('forbidden');
    expect(await testDb()('comments').where({ subject_id: others })).toHaveLength(0);
  });

  it('lets a person mentioned in a thread reply to it', async () => {
    const id = await finding(as.scout);
    await comment(as.advisor, 'observation', id, `@${team.pruner.name} can you check the graft?`);
    expect((await comment(as.pruner, 'observation', id, 'Graft is fine.')).status).toBe(201);
  });

  it('answers 401 when signed out', async () => {
    expect((await comment(new Client(), 'observation', randomUUID(), 'Hello')).status).toBe(401);
  });
});

describe('POST /api/comments', () => {
  it('keeps plain text with links as written, and lists the thread oldest first', async () => {
    const id = await finding(as.scout);
    const body = 'See https://example.com/guide?a=1&b=2 and <b>this</b>';
    const res = await comment(as.advisor, 'observation', id, `  ${body}  `);
    expect(res.status).toBe(201);
    await comment(as.manager, 'observation', id, 'Agreed.');
    const thread = (await (await as.scout.fetch(`/api/comments?subject=observation&id=${id}`)).json()).comments;
    expect(thread.map((c: { body: string; authorName: string }) => [c.body, c.authorName])).toEqual([
      [body, team.advisor.name],
      ['Agreed.', team.manager.name],
    ]);
  });

  it('names each invalid field, and stores nothing', async () => {
    const empty = await comment(as.manager, 'observation', randomUUID(), '   ');
    expect(empty.status).toBe(422);
    expect((await empty.json()).error.fields.body).toEqual(['Write a comment']);
    const long = await comment(as.manager, 'task', randomUUID(), 'x'.repeat(4001));
    expect((await long.json()).error.fields.body[0]).toMatch(/4,000/);
    const kind = await comment(as.manager, 'block', randomUUID(), 'Hi');
    expect((await kind.json()).error.fields.subject).toBeDefined();
  });

  it('answers 404 for another organisation’s finding, vine or task', async () => {
    const other = await makeTeam();
    const theirBlock = await makeBlock(other.org.id);
    const theirs = new Client();
    await theirs.signIn(other.scout.email, PASSWORD);
    const id = randomUUID();
    await theirs.json('/api/sync', 'POST', {
      observations: [{ id, blockId: theirBlock.id, row: 1, position: 1, kind: 'note', data: {}, note: 'x', observedAt: '2026-11-02T09:00:00Z' }],
    });
    const slot = await testDb()('vine_positions').where({ block_id: theirBlock.id, row_number: 1, position: 1 }).first('id');
    expect((await comment(as.manager, 'observation', id, 'Hi')).status).toBe(404);
    expect((await comment(as.advisor, 'vine', slot.id, 'Hi')).status).toBe(404);
    expect((await as.manager.fetch(`/api/comments?subject=observation&id=${id}`)).status).toBe(404);
  });

  it('shows comments on a vine in its panel', async () => {
    const slot = await testDb()('vine_positions').where({ block_id: block.id, row_number: 3, position: 9 }).first('id');
    expect((await comment(as.advisor, 'vine', slot.id, 'Renew from the sucker.')).status).toBe(201);
    const panel = await (await as.scout.fetch(`/api/vines/${slot.id}`)).json();
    expect(panel.comments).toEqual([expect.objectContaining({ text: 'Renew from the sucker.', by: team.advisor.name })]);
  });
});

describe('comment mail', () => {
  it('sends a mention exactly one e-mail, to the person mentioned, with a link back', async () => {
    const crewLead = { ...(await makeMember(team.org.id, 'pruner')), name: `Ana Crewlead ${randomUUID().slice(0, 4)}` };
    await testDb()('users').where({ id: crewLead.id }).update({ name: crewLead.name });
    const id = await finding(as.scout, 1, 7);
    const res = await comment(as.advisor, 'observation', id, `Trunk looks girdled. @${crewLead.name}, please renew it. @nobody here`);
    expect(res.status).toBe(201);
    expect((await res.json()).comment.mentions).toEqual([crewLead.id]);

    const [mail] = await waitForMail(crewLead.email, 1);
    expect(mail!.subject).toBe(
      `${team.advisor.name} mentioned you on trunk injury at ${(await testDb()('blocks').where({ id: block.id }).first()).name}, row 1, vine 7`,
    );
    expect(mail!.text).toContain('please renew it');
    expect(mail!.text).toContain(`/grid/${block.id}?row=1&position=7`);
    await settle();
    expect(await mailsTo(crewLead.email)).toHaveLength(1);
    // The finding's scout is told of the comment once; the author and bystanders get nothing.
    expect((await mailsTo(team.scout.email)).filter((m) => m.text.includes('please renew it'))).toHaveLength(1);
    expect(await mailsTo(team.advisor.email)).toHaveLength(0);
    expect(await mailsTo(team.manager.email)).toHaveLength(0);
  });

  it('sends the owner who is also mentioned one mail, not two, and finds mentions by e-mail', async () => {
    const id = await finding(as.pruner, 3, 2);
    const before = (await mailsTo(team.pruner.email)).length;
    await comment(as.manager, 'observation', id, `@${team.pruner.email} is this the one?`);
    await waitForMail(team.pruner.email, before + 1);
    await settle();
    const after = await mailsTo(team.pruner.email);
    expect(after).toHaveLength(before + 1);
    expect(after.at(-1)!.subject).toMatch(/mentioned you/);
  });

  it('tells nobody of their own comment, and respects a person who turned comment mail off', async () => {
    const id = await finding(as.scout, 2, 9);
    const prefs = await as.scout.json('/api/notifications/preferences', 'PUT', {
      assignment: true,
      comment: false,
      mention: true,
      overdue: true,
      digest: false,
    });
    expect(prefs.status).toBe(200);
    const before = (await mailsTo(team.scout.email)).length;
    await comment(as.scout, 'observation', id, `Note to self, @${team.scout.name}`);
    await comment(as.advisor, 'observation', id, 'Looks like cold damage.');
    await settle();
    expect(await mailsTo(team.scout.email)).toHaveLength(before);
    await as.scout.json('/api/notifications/preferences', 'PUT', { assignment: true, comment: true, mention: true, overdue: true, digest: false });
  });
});
