/**
 * The shop floor in a real browser against the real server and the seeded demo shop (no stubbed
 * routes): the foreman reassigns three jobs from the board; a floor user scans a work-order number
 * at the scan station (typed like a keyboard-wedge scanner: the characters, then Enter) and moves
 * the job on one stage; screenshots of the board and the scan station at tablet size (1024×768).
 *
 * Everything checked here is invented demo data (server/seed/floor.ts); no engineering values.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FLOOR_STAGES } from '../../src/contracts/floor';
import { FLOW_STAGES, flowIndex, type Stage } from '../../src/contracts/stages';
import type { WorkOrderDetail, WorkOrderSummary } from '../../src/contracts/work-orders';
import { DEMO_FLOOR_STAFF } from '../../server/seed/floor';
import { DEMO_PASSWORD, fillSignIn, launch, openPage, screenshot, signIn } from './helpers';

const TABLET = { width: 1024, height: 768 };
/** The person and station the foreman reassigns to (server/seed/floor.ts). */
const TARGET_PERSON = 'Hattie Marchbank';
const TARGET_STATION = 'Termination bench A';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function listWorkOrders(page: Page): Promise<WorkOrderSummary[]> {
  const res = await page.request.get('/api/work-orders');
  expect(res.status()).toBe(200);
  return ((await res.json()) as { workOrders: WorkOrderSummary[] }).workOrders;
}

async function detail(page: Page, id: number): Promise<WorkOrderDetail> {
  const res = await page.request.get(`/api/work-orders/${id}`);
  expect(res.status()).toBe(200);
  return (await res.json()) as WorkOrderDetail;
}

/** Signs in one of the seeded floor staff through the form. */
async function signInAs(page: Page, email: string) {
  await page.goto('/sign-in');
  await fillSignIn(page, email, DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.locator('main').first().waitFor();
}

const next = (s: Stage): Stage | undefined => FLOW_STAGES[flowIndex(s) + 1];

describe('the foreman reassigns three jobs from the board', () => {
  it('selects three cards, picks a person and a station, and exactly those three change', async () => {
    const { context, page, pageErrors } = await openPage(browser, TABLET);
    try {
      await signIn(page, 'foreman');
      await page.goto('/board');
      await page.getByTestId('board-columns').waitFor();

      const before = await listWorkOrders(page);
      const onBoard = before.filter((w) => w.stage !== 'shipped' && w.stage !== 'engineering');
      // Three cards that are not yet with that person at that station, from different columns where
      // possible (flow columns: the side states start folded).
      const candidates = onBoard.filter((w) => w.assignee?.name !== TARGET_PERSON && w.station?.name !== TARGET_STATION && w.stage !== 'on_hold' && w.stage !== 'rework');
      const picked: WorkOrderSummary[] = [];
      for (const w of candidates) {
        if (picked.length < 3 && !picked.some((p) => p.stage === w.stage)) picked.push(w);
      }
      for (const w of candidates) if (picked.length < 3 && !picked.includes(w)) picked.push(w);
      expect(picked).toHaveLength(3);

      // Every column's head counts its work orders, and late jobs carry the word, not only a colour.
      for (const stage of new Set(onBoard.map((w) => w.stage))) {
        const n = onBoard.filter((w) => w.stage === stage).length;
        await expect(page.getByTestId(`column-count-${stage}`).innerText()).resolves.toMatch(new RegExp(`^${n}\\b`));
      }
      const late = onBoard.find((w) => w.late && w.stage !== 'on_hold' && w.stage !== 'rework');
      if (late) await expect(page.locator(`[data-card="${late.number}"] [data-flag="late"]`).innerText()).resolves.toMatch(/late/i);

      for (const w of picked) await page.getByRole('checkbox', { name: `Select ${w.number}` }).check();
      await expect(page.getByTestId('assign-bar').innerText()).resolves.toContain('3 cards selected');

      await page.getByLabel('Assign to person').selectOption({ label: TARGET_PERSON });
      await page.getByLabel('Assign to station').selectOption({ label: TARGET_STATION });
      const answered = page.waitForResponse((r) => r.url().endsWith('/api/work-orders/assign') && r.request().method() === 'POST');
      await page.getByRole('button', { name: 'Reassign 3 cards' }).click();
      const res = await answered;
      expect(res.status()).toBe(200);
      const sent = res.request().postDataJSON() as { ids: number[]; versions: number[] };
      expect([...sent.ids].sort()).toEqual(picked.map((w) => w.id).sort());
      expect(sent.versions).toEqual(sent.ids.map((id) => picked.find((w) => w.id === id)!.version));
      await page.getByText('3 work orders reassigned').waitFor();

      // Through the API: exactly the three changed, to that person and station; nothing else moved.
      const after = await listWorkOrders(page);
      const changed = after.filter((a) => {
        const b = before.find((x) => x.id === a.id)!;
        return a.version !== b.version || a.assignee?.id !== b.assignee?.id || a.station?.id !== b.station?.id || a.stage !== b.stage;
      });
      expect(changed.map((w) => w.id).sort()).toEqual(picked.map((w) => w.id).sort());
      for (const w of changed) {
        expect(w.assignee?.name).toBe(TARGET_PERSON);
        expect(w.station?.name).toBe(TARGET_STATION);
      }
      // The board shows the new assignment on those cards (after its own refresh).
      for (const w of picked) {
        await expect
          .poll(() => page.locator(`[data-card="${w.number}"] [data-field="assignee"]`).innerText(), { timeout: 10_000 })
          .toBe(TARGET_PERSON);
      }
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.getByTestId('board-columns').evaluate((el) => el.scrollTo(0, 0));
      await screenshot(page, 'floor-board-tablet');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});

describe('a floor user scans a work order and moves it on', () => {
  it('opens the job from a wedge-scanner entry, refuses an unknown number, and advances one stage with one event', async () => {
    const { context, page, pageErrors } = await openPage(browser, TABLET);
    try {
      // A seeded floor person with a job they may move on one stage without the winding record
      // (not leaving winding, not into packing, which needs inspection signed).
      const movable = (w: WorkOrderSummary) => {
        const to = next(w.stage);
        return Boolean(to && w.stage !== 'winding' && FLOOR_STAGES.includes(w.stage) && to !== 'packing' && w.allowedMoves?.includes(to));
      };
      let job: WorkOrderSummary | undefined;
      let who = '';
      for (const person of DEMO_FLOOR_STAFF) {
        await context.clearCookies();
        await signInAs(page, person.email);
        job = (await listWorkOrders(page)).find(movable);
        if (job) {
          who = person.name;
          break;
        }
      }
      expect(job, 'the seed has a job a floor person may move on').toBeDefined();
      const to = next(job!.stage)!;
      const before = await detail(page, job!.id);

      await page.goto('/scan');
      const input = page.locator('#scan-input');
      await input.waitFor();
      await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('scan-input');

      // An unknown number: a clear message, and the field keeps the focus for the next scan.
      await page.keyboard.type('WO-99-99999');
      await page.keyboard.press('Enter');
      await expect(page.getByTestId('scan-error').innerText()).resolves.toContain('No work order WO-99-99999');
      expect(await page.evaluate(() => document.activeElement?.id)).toBe('scan-input');

      // The scanner types the number and Enter (lower case, as some scanners send it).
      await page.keyboard.type(job!.number.toLowerCase());
      await page.keyboard.press('Enter');
      const shown = page.getByTestId('scan-job');
      await shown.waitFor();
      await expect(shown.getAttribute('data-stage')).resolves.toBe(job!.stage);
      await expect(page.locator('#scan-input').inputValue()).resolves.toBe('');
      expect(await page.evaluate(() => document.activeElement?.id)).toBe('scan-input');

      const moved = page.waitForResponse((r) => r.url().endsWith(`/api/work-orders/${job!.id}/move`) && r.request().method() === 'POST');
      await page.getByTestId('advance').click();
      const res = await moved;
      expect(res.status()).toBe(200);
      expect(res.request().postDataJSON()).toMatchObject({ to, version: before.version });
      await expect(page.getByTestId('move-result').innerText()).resolves.toContain(job!.number.toUpperCase());
      await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('scan-input');

      // Through the API: the stage changed and exactly one event was written, by this user.
      const after = await detail(page, job!.id);
      expect(after.stage).toBe(to);
      expect(after.events).toHaveLength(before.events.length + 1);
      const last = after.events[after.events.length - 1]!;
      expect(last).toMatchObject({ kind: 'move', fromStage: job!.stage, toStage: to });
      expect(last.user?.name).toBe(who);

      // The hi-pot caution shows whenever the job on screen is in (or about to enter) testing.
      if (to === 'testing' || next(to) === 'testing') await page.getByTestId('hipot-caution').waitFor();
      await screenshot(page, 'floor-scan-station-tablet');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
