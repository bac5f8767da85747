/**
 * axe (WCAG 2.2 A and AA) on every page of the app, for every role, on a phone and on a laptop.
 * The pages come from the file system: a new app/**\/page.tsx without a row in PAGES fails here.
 */
import { createHash, createHmac, randomBytes, randomUUID } from 'node:crypto';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { expect, test, type Page } from '@playwright/test';
import { can, homeFor, ROLES, type Permission, type Role } from '@/lib/roles';
import { closeTestDb, testDb } from '../helpers/fixtures';
import { pageViolations } from './helpers/axe';
import { signInAs } from './helpers/session';

const UPPER_TERRACE = '0b10c4a0-0000-4000-8000-000000000001';
const CREEK_FLAT = '0b10c4a0-0000-4000-8000-000000000002';
const DEMO_USER = { manager: 'manager@example.com', scout: 'scout@example.com', pruner: 'pruner@example.com', advisor: 'advisor@example.com' } as const;
const DEMO_ORG = '5d1f0a3e-7c2b-4e8a-9b61-0a0d2c9e4f01';
const SCOUT_ID = '8a6b2c10-1d4e-4f3a-8b7c-000000000002';
/** The demo's retraining task (db/seeds/demo-work.ts derives its id from this name). */
const demoId = (name: string) => {
  const h = createHash('sha256').update(`vineward-demo:${name}`).digest('hex');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-4${h.slice(13, 16)}-${((parseInt(h[16]!, 16) & 3) | 8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
};
const RETRAIN_TASK = demoId('task:ut-retrain');

const VIEWPORTS = {
  phone: { viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true },
  laptop: { viewport: { width: 1280, height: 800 }, isMobile: false, hasTouch: false },
} as const;

/** Something to do on a page before a second axe run: open what hides content until asked. */
interface Step {
  label: string;
  act: (page: Page, role?: Role) => Promise<void>;
}

interface PageCase {
  /** Where to go; dynamic segments filled with demo ids. */
  url: string;
  /** Who may open it: a permission for member pages, 'public' for pages anyone opens signed out. */
  who: Permission | 'public' | 'home';
  /** Further states of the same page, each checked again (a URL that opens a panel, a tapped form). */
  more?: (Step & { url?: string })[];
}

let invitationToken = '';

/** Every app/**\/page.tsx, keyed by its file path under app/. */
const PAGES: Record<string, PageCase> = {
  '(app)/page.tsx': { url: '/', who: 'home' },
  '(app)/blocks/page.tsx': { url: '/blocks', who: 'read' },
  '(app)/blocks/new/page.tsx': { url: '/blocks/new', who: 'manage-organisation' },
  '(app)/blocks/[id]/page.tsx': {
    url: `/blocks/${UPPER_TERRACE}`,
    who: 'read',
    more: [
      {
        label: 'a row’s vines open',
        act: async (page) => {
          await page.getByRole('button', { name: 'Row 1 vines' }).click();
          await page.getByRole('list', { name: 'Vines of row 1' }).getByRole('button').nth(1).click();
        },
      },
    ],
  },
  '(app)/blocks/[id]/edit/page.tsx': { url: `/blocks/${UPPER_TERRACE}/edit`, who: 'manage-organisation' },
  '(app)/blocks/[id]/import/page.tsx': { url: `/blocks/${UPPER_TERRACE}/import`, who: 'manage-organisation' },
  '(app)/desk/page.tsx': { url: '/desk', who: 'read' },
  '(app)/field/page.tsx': { url: '/field', who: 'read' },
  '(app)/field/blocks/[blockId]/page.tsx': { url: `/field/blocks/${UPPER_TERRACE}`, who: 'read' },
  '(app)/field/blocks/[blockId]/walk/page.tsx': {
    url: `/field/blocks/${UPPER_TERRACE}/walk?row=3&position=20`,
    who: 'read',
    more: [
      {
        label: 'the cane diameter form open',
        act: async (page) => {
          const open = page.getByRole('button', { name: 'Cane diameter' });
          if ((await open.count()) === 0) return;
          await open.click();
          await expect(page.getByRole('form', { name: 'Cane diameter' })).toBeVisible();
        },
      },
      {
        label: 'the row end with its row work form',
        url: `/field/blocks/${UPPER_TERRACE}/walk?row=23&position=60`,
        act: async (page, role) => {
          if (role && can(role, 'record-row-work')) await expect(page.getByTestId('row-end')).toBeVisible();
        },
      },
    ],
  },
  '(app)/field/outbox/page.tsx': { url: '/field/outbox', who: 'read' },
  '(app)/field/tasks/page.tsx': {
    url: '/field/tasks',
    who: 'complete-task',
    more: [{ label: 'a task’s walk', url: `/field/tasks?task=${RETRAIN_TASK}`, act: async () => {} }],
  },
  '(app)/flags/page.tsx': { url: '/flags', who: 'read' },
  '(app)/grid/page.tsx': { url: '/grid', who: 'read' },
  '(app)/grid/[blockId]/page.tsx': {
    url: `/grid/${UPPER_TERRACE}`,
    who: 'read',
    more: [
      {
        label: 'the vine panel open on a vine with photos and findings',
        url: `/grid/${CREEK_FLAT}?kind=trunk-injury&row=1&position=9`,
        act: async (page) => {
          await expect(page.getByTestId('vine-panel').getByRole('heading', { level: 2 })).toBeVisible();
        },
      },
      {
        label: 'the photo viewer open',
        url: `/grid/${CREEK_FLAT}?kind=trunk-injury&row=1&position=9`,
        act: async (page) => {
          const photo = page
            .getByTestId('vine-panel')
            .getByRole('button', { name: /Open the photo/ })
            .first();
          await photo.click();
          await expect(page.getByRole('dialog')).toBeVisible();
        },
      },
    ],
  },
  '(app)/photos/page.tsx': { url: '/photos', who: 'read' },
  '(app)/plans/page.tsx': { url: '/plans', who: 'read' },
  '(app)/reports/page.tsx': { url: '/reports', who: 'read' },
  '(app)/reports/[blockId]/page.tsx': { url: `/reports/${UPPER_TERRACE}`, who: 'read' },
  '(app)/reports/[blockId]/weights/page.tsx': { url: `/reports/${UPPER_TERRACE}/weights`, who: 'read' },
  '(app)/reports/export/page.tsx': { url: '/reports/export', who: 'read' },
  '(app)/safety/page.tsx': { url: '/safety', who: 'read' },
  '(app)/settings/page.tsx': { url: '/settings', who: 'read' },
  '(app)/settings/notifications/page.tsx': { url: '/settings/notifications', who: 'read' },
  '(app)/sprays/page.tsx': { url: '/sprays', who: 'read' },
  '(app)/tasks/page.tsx': { url: '/tasks', who: 'read' },
  '(app)/tasks/[id]/page.tsx': { url: `/tasks/${RETRAIN_TASK}`, who: 'read' },
  '(app)/tasks/pruning-checks/page.tsx': { url: '/tasks/pruning-checks', who: 'read' },
  '(app)/team/page.tsx': { url: '/team', who: 'manage-organisation' },
  '(app)/work/page.tsx': { url: '/work', who: 'read' },
  '(app)/work/[blockId]/page.tsx': { url: `/work/${UPPER_TERRACE}`, who: 'read' },
  '(auth)/signin/page.tsx': {
    url: '/signin',
    who: 'public',
    more: [{ label: 'the e-mail link way chosen', act: async (page) => page.getByRole('button', { name: 'E-mail me a link' }).click() }],
  },
  '(auth)/signin/check-email/page.tsx': { url: '/signin/check-email', who: 'public' },
  '(auth)/invite/[token]/page.tsx': {
    url: '/invite/INVITATION',
    who: 'public',
    more: [{ label: 'an unknown invitation', url: `/invite/${'x'.repeat(43)}`, act: async () => {} }],
  },
  'offline/page.tsx': { url: '/offline', who: 'public' },
  'unsubscribe/page.tsx': {
    url: `/unsubscribe?token=UNSUBSCRIBE`,
    who: 'public',
    more: [{ label: 'a broken link', url: '/unsubscribe?token=nope', act: async () => {} }],
  },
};

function pageFiles(dir = path.join(process.cwd(), 'app'), base = ''): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const rel = base ? `${base}/${e.name}` : e.name;
    if (e.isDirectory()) return pageFiles(path.join(dir, e.name), rel);
    return e.name === 'page.tsx' ? [rel] : [];
  });
}

const fill = (url: string) =>
  url.replace('INVITATION', invitationToken).replace(
    'UNSUBSCRIBE',
    encodeURIComponent(
      `${SCOUT_ID}.${createHmac('sha256', process.env.NEXTAUTH_SECRET ?? '')
        .update(`vineward-digest-unsubscribe:${SCOUT_ID}`)
        .digest('base64url')}`,
    ),
  );

/** Waits until the page has drawn what it fetches after load (the field pages read their layout). */
async function settle(page: Page) {
  await page.waitForLoadState('networkidle', { timeout: 3_000 }).catch(() => {});
  await expect(page.getByText(/^(Loading|Cargando)…?$/)).toHaveCount(0, { timeout: 10_000 });
}

async function visit(page: Page, url: string) {
  const answer = await page.goto(fill(url));
  await settle(page);
  return answer;
}

/** Checks a page and its further states; returns every violation found, each line naming where. */
async function checkPage(page: Page, file: string, c: PageCase, role: Role | 'signed out'): Promise<string[]> {
  const found = await pageViolations(page, `${file} ${c.url}`);
  for (const step of c.more ?? []) {
    if (step.url) await visit(page, step.url);
    else await visit(page, c.url);
    await step.act(page, role === 'signed out' ? undefined : role);
    await page.waitForTimeout(300);
    found.push(...(await pageViolations(page, `${file} ${step.url ?? c.url} (${step.label})`)));
  }
  return found;
}

test.beforeAll(async () => {
  const db = testDb();
  const org = await db('organisations').where({ name: 'Ninefold Ridge Estate' }).first('id');
  invitationToken = randomBytes(32).toString('base64url');
  await db('invitations').insert({
    organisation_id: org.id,
    email: `axe-${randomUUID().slice(0, 8)}@example.com`,
    role: 'scout',
    token_hash: createHash('sha256').update(invitationToken).digest('hex'),
    invited_by: '8a6b2c10-1d4e-4f3a-8b7c-000000000001',
    expires_at: new Date(Date.now() + 7 * 24 * 3600 * 1000),
  });
});

test.afterAll(async () => {
  await testDb()('invitations')
    .where({ token_hash: createHash('sha256').update(invitationToken).digest('hex') })
    .del();
  await closeTestDb();
});

test('every page on disk has an accessibility case, and every case a page', () => {
  expect(pageFiles().sort()).toEqual(Object.keys(PAGES).sort());
});

for (const [size, use] of Object.entries(VIEWPORTS)) {
  test.describe(`at ${use.viewport.width} × ${use.viewport.height}`, () => {
    test.use(use);

    test('signed out: the public pages, the not-found page, and sign-in for a member page', async ({ page }) => {
      test.setTimeout(180_000);
      page.setDefaultTimeout(15_000);
      const found: string[] = [];
      for (const [file, c] of Object.entries(PAGES).filter(([, c]) => c.who === 'public')) {
        await visit(page, c.url);
        found.push(...(await checkPage(page, file, c, 'signed out')));
      }
      expect((await visit(page, '/no-such-page'))?.status()).toBe(404);
      found.push(...(await pageViolations(page, 'not-found /no-such-page')));
      await visit(page, '/desk');
      await expect(page).toHaveURL(/\/signin/);
      expect(found, `${size}: violations`).toEqual([]);
    });

    for (const role of ROLES) {
      test(`as ${role}: every member page, refused ones included`, async ({ page, baseURL }) => {
        test.setTimeout(600_000);
        page.setDefaultTimeout(15_000);
        await signInAs(page, DEMO_USER[role]);
        // The advisor consults for more than one grower: work in the demo estate, where the ids are.
        await page.context().addCookies([{ name: 'vw-org', value: DEMO_ORG, url: baseURL! }]);
        const found: string[] = [];
        for (const [file, c] of Object.entries(PAGES)) {
          if (c.who === 'public') continue;
          const answer = await visit(page, c.url);
          if (c.who === 'home' || !can(role, c.who)) {
            // A page the role may not open sends it home (memberForPage); the '/' case checks that page.
            await expect(page, `${role} on ${c.url}`).toHaveURL(new RegExp(`${homeFor(role)}$`));
            if (c.who === 'home') found.push(...(await pageViolations(page, `${file} ${c.url} → ${homeFor(role)}`)));
            continue;
          }
          expect(new URL(page.url()).pathname, `${role} opens ${c.url}`).toBe(new URL(fill(c.url), 'http://x').pathname);
          expect(answer?.status(), `${role} opens ${c.url}`).toBe(200);
          found.push(...(await checkPage(page, file, c, role)));
        }
        expect((await visit(page, '/no-such-page'))?.status()).toBe(404);
        found.push(...(await pageViolations(page, 'not-found /no-such-page')));
        expect(found, `${size}, ${role}: violations`).toEqual([]);
      });
    }
  });
}
