/**
 * The board as two people use it at once, in a real browser against the real server (no stubbed
 * routes): the foreman drags a card one column on; a move made elsewhere reaches the open board
 * through the live feed without a reload; and a move the foreman confirms after someone else moved
 * the same work order is refused with 409 and shows the work order as it is now, overwriting
 * nothing.
 *
 * Everything here is invented demo data (server/seed/floor.ts); no engineering values.
 */
import type { APIRequestContext, Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import { FLOW_STAGES, flowIndex, STAGE_LABELS, type Stage } from '../../src/contracts/stages';
import type { WorkOrderDetail, WorkOrderSummary } from '../../src/contracts/work-orders';
import { request } from 'playwright-core';
import { baseURL, DEMO_PASSWORD, demoEmail, launch, openPage, screenshot, signIn } from './helpers';

/** Stages whose forward move needs no form (no winding record, no inspection gate, no test gate). */
const PLAIN_FORWARD: readonly Stage[] = ['terminating', 'impregnating', 'curing'];
const next = (s: Stage): Stage => FLOW_STAGES[flowIndex(s) + 1]!;

let browser: Browser;
/** A second person: the admin, signed in through the API with its own cookies. */
let other: APIRequestContext;

async function csrfPost(api: APIRequestContext, url: string, data: unknown) {
  return api.post(url, { data, headers: { [CSRF_HEADER]: CSRF_VALUE } });
}

beforeAll(async () => {
  browser = await launch();
  other = await request.newContext({ baseURL: baseURL() });
  const res = await csrfPost(other, '/api/auth/login', { email: demoEmail('admin'), password: DEMO_PASSWORD });
  expect(res.status()).toBe(200);
});
afterAll(async () => {
  await other?.dispose();
  await browser?.close();
});

async function workOrders(api: APIRequestContext): Promise<WorkOrderSummary[]> {
  const res = await api.get('/api/work-orders');
  expect(res.status()).toBe(200);
  return ((await res.json()) as { workOrders: WorkOrderSummary[] }).workOrders;
}

async function moveElsewhere(wo: WorkOrderSummary, to: Stage, note?: string): Promise<WorkOrderDetail> {
  const res = await csrfPost(other, `/api/work-orders/${wo.id}/move`, { to, version: wo.version, ...(note && { note }) });
  expect(res.status(), await res.text()).toBe(200);
  return (await res.json()) as WorkOrderDetail;
}

const card = (page: Page, stage: Stage, number: string) => page.locator(`[data-column="${stage}"] [data-card="${number}"]`);

describe('the board with two people at work', () => {
  it('drags a card on, hears of a move made elsewhere, and refuses a stale move with the work order as it is now', async () => {
    // Tall enough that the cards dragged are on screen, so a drag needs no scrolling on the way.
    const { context, page, pageErrors } = await openPage(browser, { width: 1600, height: 2400 });
    try {
      await signIn(page, 'foreman');
      await page.goto('/board');
      await page.getByTestId('board-columns').waitFor();
      await page.locator('[data-live="live"]').waitFor();

      const all = await workOrders(page.request);
      const plain = all.filter((w) => PLAIN_FORWARD.includes(w.stage) && w.allowedMoves?.includes(next(w.stage)));
      expect(plain.length, 'the seed has at least three work orders in the finishing stages').toBeGreaterThanOrEqual(3);
      // The card dragged is the top card of its column (on screen without scrolling).
      const firstShown = await page.locator(`[data-column="${plain[0]!.stage}"] [data-card]`).first().getAttribute('data-card');
      const dragged = plain.find((w) => w.number === firstShown)!;
      const [heard, stale] = plain.filter((w) => w !== dragged);

      // 1. Drag a card to the next column: a forward move with nothing to record goes at once.
      const dragTo = next(dragged!.stage);
      const moved = page.waitForResponse((r) => r.url().endsWith(`/api/work-orders/${dragged!.id}/move`) && r.request().method() === 'POST');
      await card(page, dragged!.stage, dragged!.number).dragTo(page.locator(`[data-column="${dragTo}"]`));
      const res = await moved;
      expect(res.status()).toBe(200);
      expect(res.request().postDataJSON()).toEqual({ to: dragTo, version: dragged!.version });
      await card(page, dragTo, dragged!.number).waitFor();
      await expect(page.getByText(`${dragged!.number} moved to`).innerText()).resolves.toContain(dragged!.number);

      // 2. Someone else moves another work order; the open board shows it in its new column
      //    through the live feed (no reload, no polling: the badge says live).
      const heardTo = next(heard!.stage);
      await moveElsewhere(heard!, heardTo);
      await card(page, heardTo, heard!.number).waitFor({ timeout: 10_000 });
      expect(await card(page, heard!.stage, heard!.number).count()).toBe(0);
      expect(await page.locator('[data-live]').getAttribute('data-live')).toBe('live');

      // 3. The foreman starts putting a work order on hold (a form: the reason); meanwhile someone
      //    else moves it on. Confirming the hold is refused (409); nothing is overwritten and the
      //    dialog shows where the work order is now.
      const freshStale = (await workOrders(page.request)).find((w) => w.id === stale!.id)!;
      const eventsBefore = ((await (await other.get(`/api/work-orders/${freshStale.id}`)).json()) as WorkOrderDetail).events.length;
      // The touch way this time: the card's Move… button, then the stage.
      await page.getByRole('button', { name: `Move ${freshStale.number}` }).click();
      await page.getByRole('dialog').getByRole('button', { name: /On hold/ }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByRole('button', { name: /^Move to/ }).waitFor();
      await dialog.getByLabel(/on hold/i).fill('Waiting for the customer to confirm the lead length');
      const elsewhere = await moveElsewhere(freshStale, next(freshStale.stage));
      const refused = page.waitForResponse((r) => r.url().endsWith(`/api/work-orders/${freshStale.id}/move`) && r.request().method() === 'POST');
      await dialog.getByRole('button', { name: /^Move to/ }).click();
      expect((await refused).status()).toBe(409);
      const conflict = dialog.getByTestId('conflict');
      await conflict.waitFor();
      await expect(conflict.innerText()).resolves.toContain(`${freshStale.number}: now ${STAGE_LABELS[elsewhere.stage]}`);
      await expect(conflict.innerText()).resolves.toMatch(/nothing was overwritten/i);
      // The confirm button is gone; only Close is offered.
      expect(await dialog.getByRole('button', { name: /^Move to/ }).count()).toBe(0);
      await screenshot(page, 'floor-board-conflict');

      // Through the API: the other person's move stands, and no hold was written (one new event: theirs).
      const after = await other.get(`/api/work-orders/${freshStale.id}`);
      const detail = (await after.json()) as WorkOrderDetail;
      expect(detail.stage).toBe(next(freshStale.stage));
      expect(detail.version).toBe(elsewhere.version);
      expect(detail.events).toHaveLength(eventsBefore + 1);
      expect(detail.events[detail.events.length - 1]).toMatchObject({ toStage: next(freshStale.stage) });
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
