/**
 * The board at a big shop's size, in a real browser against the real server: a column of 150+
 * work orders draws only the cards in view and fetches the rest a page at a time as it is
 * scrolled; the search box finds one work order among them (and keeps the search in the address);
 * and a change made by someone else reaches the open board as that one card over the live feed,
 * without the board asking for its lists again (the requests are counted).
 *
 * The extra work orders are clones of a demo work order (invented demo data), removed afterwards.
 */
import { sql } from 'drizzle-orm';
import type { APIRequestContext, Browser, Request } from 'playwright-core';
import { request } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/client';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import type { BoardResponse } from '../../src/contracts/board';
import { baseURL, DEMO_PASSWORD, demoEmail, launch, openPage, screenshot, signIn } from './helpers';

const CLONES = 160;
const { db, pool } = createDb(loadConfig({ ...process.env, NODE_ENV: 'test' }).databaseUrl, 2);
let browser: Browser;
let other: APIRequestContext;
let clones: { id: number; number: string }[] = [];

beforeAll(async () => {
  // Clones of a demo work order in `ready`, due far ahead (so they sort after the demo's own).
  const made = await db.execute<{ id: number; number: string }>(sql`
    insert into work_orders (number, order_id, line_id, build_sheet_id, stage, quantity, due_date, priority, version)
    select 'WO-' || to_char(now(), 'YY') || '-' || lpad(nextval('work_order_number_seq')::text, 5, '0'),
           t.order_id, t.line_id, t.build_sheet_id, 'ready', t.quantity, current_date + 200 + g, 0, 1
    from (select * from work_orders where stage = 'ready' order by id limit 1) t, generate_series(1, ${CLONES}) g
    returning id, number`);
  clones = made.rows.sort((a, b) => a.id - b.id);
  await db.execute(sql`insert into work_order_events (work_order_id, from_stage, to_stage, note, kind)
    select id, null, 'ready', 'Released', 'release' from work_orders where id = any(${`{${clones.map((c) => c.id).join(',')}}`}::int[])`);
  browser = await launch();
  other = await request.newContext({ baseURL: baseURL() });
  const res = await other.post('/api/auth/login', { data: { email: demoEmail('admin'), password: DEMO_PASSWORD }, headers: { [CSRF_HEADER]: CSRF_VALUE } });
  expect(res.status()).toBe(200);
});

afterAll(async () => {
  await other?.dispose();
  await browser?.close();
  const ids = `{${clones.map((c) => c.id).join(',')}}`;
  await db.execute(sql`delete from work_order_events where work_order_id = any(${ids}::int[])`);
  await db.execute(sql`delete from work_orders where id = any(${ids}::int[])`);
  await pool.end();
});

describe('a long column', () => {
  it('scrolls through 150+ cards drawing only those in view, and finds one by search', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1366, height: 900 });
    try {
      await signIn(page, 'foreman');
      await page.goto('/board?view=compact');
      const ready = page.locator('[data-column="ready"]');
      await ready.locator('[data-card]').first().waitFor();
      const head = await page.getByTestId('column-count-ready').innerText();
      const total = Number(head.split(' ')[0]);
      expect(total).toBeGreaterThanOrEqual(CLONES);
      // Every stage is on screen at 1366 px: no column starts beyond the right edge.
      const right = await page.getByTestId('board-columns').evaluate((el) => Math.max(...[...el.querySelectorAll('[data-column]')].map((c) => c.getBoundingClientRect().right)));
      expect(right).toBeLessThanOrEqual(1366);
      await screenshot(page, 'floor-board-1366-compact', { fullPage: false });

      // Scroll the column to its end, page by page, as a person would with the wheel.
      const scroller = page.getByTestId('column-scroll-ready');
      const last = clones[clones.length - 1]!;
      let drawnMost = 0;
      for (let i = 0; i < 80 && (await ready.locator(`[data-card="${last.number}"]`).count()) === 0; i++) {
        await scroller.evaluate((el) => el.scrollBy(0, el.clientHeight));
        await page.waitForTimeout(120);
        drawnMost = Math.max(drawnMost, await ready.locator('[data-card]').count());
      }
      await ready.locator(`[data-card="${last.number}"]`).waitFor();
      // Virtualised: a few dozen cards at most are ever in the page, not the whole column.
      expect(drawnMost).toBeLessThan(60);
      expect(drawnMost).toBeGreaterThan(3);

      // Search for one work order in the middle of the clones.
      const wanted = clones[Math.floor(CLONES / 2)]!;
      await page.getByLabel('Search').fill(wanted.number.toLowerCase());
      await page.waitForURL((u) => u.searchParams.get('q') === wanted.number.toLowerCase());
      await ready.locator(`[data-card="${wanted.number}"]`).waitFor();
      await expect.poll(() => page.getByTestId('column-count-ready').innerText()).toMatch(/^1 job\b/);
      expect(await page.locator('[data-card]').count()).toBe(1);
      // The address keeps the search and the view: a reload shows the same.
      await page.reload();
      await ready.locator(`[data-card="${wanted.number}"]`).waitFor();
      expect(new URL(page.url()).searchParams.get('view')).toBe('compact');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});

describe('the live feed on a big board', () => {
  it('changes one card in place without asking for the board again', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1366, height: 900 });
    try {
      await signIn(page, 'foreman');
      await page.goto('/board');
      await page.locator('[data-live="live"]').waitFor();
      // The board as loaded (and the revalidation the feed asks for when it connects) is done.
      await page.waitForTimeout(1500);
      const board = (await (await page.request.get('/api/board')).json()) as BoardResponse;
      const card = board.columns.find((c) => c.stage === 'ready')!.cards[0]!;
      const shown = page.locator(`[data-column="ready"] [data-card="${card.number}"]`);
      await shown.waitFor();

      const asked: string[] = [];
      const onRequest = (r: Request) => {
        const u = new URL(r.url());
        if (u.pathname.startsWith('/api/board') || u.pathname === '/api/work-orders') asked.push(u.pathname + u.search);
      };
      page.on('request', onRequest);

      // Someone else assigns the work order to a floor hand.
      const people = (await (await other.get('/api/floor/load?days=1')).json()) as { people: { id: number; name: string }[] };
      const hand = people.people.find((p) => p.id !== card.assignee?.id)!;
      const res = await other.post('/api/work-orders/assign', { data: { ids: [card.id], assigneeId: hand.id }, headers: { [CSRF_HEADER]: CSRF_VALUE } });
      expect(res.status()).toBe(200);
      await expect.poll(() => shown.locator('[data-field="assignee"]').innerText(), { timeout: 10_000 }).toBe(hand.name);
      // A moment for anything the change might have set off.
      await page.waitForTimeout(1000);
      page.off('request', onRequest);
      expect(asked).toEqual([]);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
