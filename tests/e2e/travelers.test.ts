/**
 * Printing a whole order's travelers from the order page, with the progress bar, against the
 * real server, queue, worker and object store; and the admin's outbox after the worker has sent
 * the demo shop's pending e-mail to the mail catcher.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, openFromNav, openPage, runWorkersDuringFile, screenshot, signIn } from './helpers';

let browser: Browser;
// The queues' workers and the outbox dispatcher, in this process (the test server runs the API only).
runWorkersDuringFile();

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('travelers from the order page', () => {
  it('the office prints every traveler of an order as one PDF, following its progress', async () => {
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await signIn(page, 'office');
      // An order in production with two or three work orders (the demo seed has several).
      const orderId = await page.evaluate(async () => {
        const res = await fetch('/api/work-orders');
        const { workOrders } = (await res.json()) as { workOrders: { order: { id: number } }[] };
        const counts = new Map<number, number>();
        for (const w of workOrders) counts.set(w.order.id, (counts.get(w.order.id) ?? 0) + 1);
        return [...counts].find(([, n]) => n >= 2 && n <= 3)?.[0] ?? null;
      });
      expect(orderId).not.toBeNull();
      await page.goto(`/orders/${orderId}`);
      const rows = page.locator('[data-work-order]');
      await rows.first().waitFor();
      const numbers = await rows.evaluateAll((els) => els.map((e) => e.getAttribute('data-work-order')));
      await page.getByRole('button', { name: 'Print all travelers of this order' }).click();
      const bar = page.getByRole('progressbar', { name: 'Printing travelers' });
      await bar.waitFor();
      const link = page.getByRole('link', { name: /Open the PDF/ });
      await link.waitFor({ timeout: 60_000 });
      expect(await bar.getAttribute('aria-valuenow')).toBe('100');
      expect(await link.innerText()).toContain(`${numbers.length} travelers`);
      await screenshot(page, 'order-travelers-printed');
      const href = (await link.getAttribute('href'))!;
      const pdf = await page.evaluate(async (url) => {
        const res = await fetch(url);
        const bytes = new Uint8Array(await res.arrayBuffer());
        return { status: res.status, type: res.headers.get('content-type'), head: String.fromCharCode(...bytes.slice(0, 5)), size: bytes.length };
      }, href);
      expect(pdf).toMatchObject({ status: 200, type: 'application/pdf', head: '%PDF-' });
      expect(pdf.size).toBeGreaterThan(10_000);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('the admin sees the outbox: messages sent by the worker, with the mailbox viewer linked', async () => {
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await signIn(page, 'admin');
      await openFromNav(page, 'Outbox');
      await page.getByRole('heading', { name: 'Outbox and background work' }).waitFor();
      // The demo shop's pending acknowledgements go out through the worker running above.
      await page.locator('[data-status="good"]', { hasText: 'Sent' }).first().waitFor({ timeout: 30_000 });
      expect(await page.getByRole('link', { name: 'Open the local mailbox viewer' }).getAttribute('href')).toMatch(/^http:\/\/127\.0\.0\.1:1080/);
      await screenshot(page, 'admin-outbox');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('the admin sets the shop’s paper and batch size; a bad value is refused beside its field', async () => {
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await signIn(page, 'admin');
      await openFromNav(page, 'Settings');
      await page.getByRole('heading', { name: 'Shop settings' }).waitFor();
      await page.getByLabel('Units per work order').fill('0');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await page.getByText('At least 1').waitFor();
      await page.getByLabel('Units per work order').fill('20');
      await page.getByLabel('Paper for travelers').selectOption('LETTER');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await page.getByText('Settings saved').waitFor();
      const saved = await page.evaluate(async () => (await (await fetch('/api/settings')).json()).settings);
      expect(saved).toMatchObject({ unitsPerWorkOrder: 20, paper: 'LETTER' });
      await screenshot(page, 'admin-settings');
      // Put the demo shop back as it was.
      await page.getByLabel('Units per work order').fill('25');
      await page.getByLabel('Paper for travelers').selectOption('A4');
      await page.getByRole('button', { name: 'Save settings' }).click();
      await page.getByText('Settings saved').waitFor();
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
