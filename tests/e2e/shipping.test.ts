/**
 * Shipping a packed work order and the customer seeing it, in a real browser against the real
 * server, database, queue, document worker and object store: the shipping user picks a ready
 * work order on Ready to ship, fills the shipment (carrier, tracking number, one package), and
 * watches its packing list and certificate become ready; then a customer user of that company
 * sees the order's line shipped with the tracking number and downloads the certificate (a PDF).
 * Two customers' work orders in one shipment are refused by the server, and the form says why
 * beside the work order it names.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { UserRecord } from '../../src/contracts/users';
import type { PortalOrderDetail, ReadyToShip, ShipmentRecord } from '../../src/contracts/shipments';
import { DEMO_PASSWORD, fillSignIn, launch, navOffers, openFromNav, openPage, runWorkersDuringFile, screenshot, signIn } from './helpers';

let browser: Browser;
// The queues' workers and the outbox dispatcher, in this process (the test server runs the API only).
runWorkersDuringFile();

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const getJson = async <T,>(page: Page, path: string): Promise<T> => {
  const res = await page.request.get(path);
  expect(res.status(), `GET ${path}`).toBe(200);
  return (await res.json()) as T;
};

/** Signs in with any demo account's e-mail (the customer users are not one per role). */
async function signInAs(page: Page, email: string) {
  await page.goto('/sign-in');
  await fillSignIn(page, email, DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.locator('main').first().waitFor();
}

/** A PDF fetched by the page with its session: status, type and the first bytes. */
const fetchPdf = (page: Page, href: string) =>
  page.evaluate(async (url) => {
    const res = await fetch(url);
    const bytes = new Uint8Array(await res.arrayBuffer());
    return { status: res.status, type: res.headers.get('content-type'), head: String.fromCharCode(...bytes.slice(0, 5)), size: bytes.length };
  }, href);

describe('shipping a packed work order', () => {
  it('shipping ships it with tracking; the customer sees the line shipped and downloads the certificate', async () => {
    // Which companies have a customer user (the admin's user list).
    const admin = await openPage(browser);
    let customerEmail: Map<number, string>;
    try {
      await signIn(admin.page, 'admin');
      const { users } = await getJson<{ users: UserRecord[] }>(admin.page, '/api/users');
      customerEmail = new Map(users.filter((u) => u.role === 'customer' && u.customerId !== null && u.active).map((u) => [u.customerId!, u.email]));
    } finally {
      await admin.context.close();
    }

    const { context, page, pageErrors } = await openPage(browser, { width: 1280, height: 800 });
    let shipment: ShipmentRecord;
    let orderId: number;
    let lineId: number;
    let email: string;
    try {
      await signIn(page, 'shipping');
      const ready = await getJson<ReadyToShip>(page, '/api/shipping/ready');
      // A ready work order of a company with a customer user; and one that may not ship yet.
      const candidates = ready.customers.flatMap((c) =>
        c.orders.flatMap((o) => o.workOrders.filter((w) => w.ready && w.quantity > 0 && customerEmail.has(c.id)).map((w) => ({ c, o, w }))),
      );
      expect(candidates.length, 'a ready work order of a company with a customer user').toBeGreaterThan(0);
      const { c, o, w } = candidates[0];
      orderId = o.id;
      lineId = w.lineId;
      email = customerEmail.get(c.id)!;
      const otherReady = ready.customers.filter((x) => x.id !== c.id).flatMap((x) => x.orders.flatMap((y) => y.workOrders.filter((z) => z.ready)))[0];
      expect(otherReady, 'a ready work order of another customer (demo seed)').toBeTruthy();

      // Two customers' work orders in one shipment (typed into the address; the list never offers
      // it): the server refuses, and the form says why beside the work order it names.
      await page.goto(`/shipments/new?wo=${w.id},${otherReady.id}`);
      await page.getByRole('heading', { name: 'New shipment' }).waitFor();
      await page.getByText('These work orders belong to more than one customer').waitFor();
      await page.getByLabel('Carrier', { exact: true }).fill('Harrow Parcel');
      await page.getByLabel('Weight (kg)').fill('1');
      await page.getByLabel('Length (mm)').fill('100');
      await page.getByLabel('Width (mm)').fill('100');
      await page.getByLabel('Height (mm)').fill('100');
      if (!(await page.getByLabel('Street and number').inputValue())) {
        await page.getByLabel('Street and number').fill('1 Test Lane');
        await page.getByLabel('Town or city').fill('Testbury');
        await page.getByLabel('Country').fill('Testland');
      }
      await page.getByRole('button', { name: 'Record shipment' }).click();
      const beside = page.locator('[data-error-for="items.1.workOrderId"]');
      await beside.waitFor();
      expect(await beside.innerText()).toContain(`not ${c.name}`);
      expect(await page.locator('[data-error-for="items.0.workOrderId"]').count(), 'nothing said against the first').toBe(0);
      expect(await page.getByText('A shipment goes to one customer').count()).toBe(1);
      expect(page.url()).toContain('/shipments/new');

      // Ready to ship, from the navigation.
      await openFromNav(page, 'Ready to ship');
      await page.getByRole('heading', { name: 'Ready to ship' }).waitFor();
      const row = page.locator(`[data-work-order="${w.number}"]`);
      await row.waitFor();
      expect(await row.getByText('Ready', { exact: true }).count()).toBe(1);
      await page.getByLabel(`Ship ${w.number}`).check();
      expect((await page.getByTestId('selection').innerText()).replace(/\s+/g, ' ')).toContain(`1 work order of ${c.name} chosen`);
      // Another customer's work orders cannot join this shipment.
      expect(await page.getByLabel(`Ship ${otherReady.number}`).isDisabled()).toBe(true);
      await screenshot(page, 'shipping-ready', { fullPage: false });
      await page.getByRole('button', { name: 'Prepare shipment' }).click();

      // The form: the ship-to address comes from the customer; the contract's messages show at the fields.
      await page.getByRole('heading', { name: 'New shipment' }).waitFor();
      expect(await page.locator(`[data-item="${w.number}"]`).count()).toBe(1);
      if (c.shipTo) expect(await page.getByLabel('Street and number').inputValue()).toBe(c.shipTo.line1);
      await page.getByRole('button', { name: 'Record shipment' }).click();
      await page.getByText('Enter the carrier').waitFor();
      expect(await page.getByText('Weight: enter a number').count()).toBe(1);

      const tracking = `HP${Date.now()}`;
      await page.getByLabel('Carrier', { exact: true }).fill('Harrow Parcel');
      await page.getByLabel('Service').fill('Economy, 2–3 days');
      await page.getByLabel('Tracking number').fill(tracking);
      await page.getByLabel('Weight (kg)').fill('4.2');
      await page.getByLabel('Length (mm)').fill('300');
      await page.getByLabel('Width (mm)').fill('200');
      await page.getByLabel('Height (mm)').fill('150');
      await page.getByLabel('Attention').fill('Goods in');
      expect(await page.getByTestId('form-total-weight').innerText()).toContain('4.20\u00a0kg');
      await screenshot(page, 'shipment-form');
      await page.getByRole('button', { name: 'Record shipment' }).click();

      // The shipment page: what was recorded, and the documents drawn by the worker.
      await page.waitForURL(/\/shipments\/\d+$/);
      await page.locator('[data-shipment]').waitFor();
      const shipmentId = Number(new URL(page.url()).pathname.split('/').pop());
      expect(await page.getByTestId('tracking-number').innerText()).toBe(tracking);
      expect(await page.locator(`[data-item="${w.number}"]`).count()).toBe(1);
      expect(await page.getByTestId('total-weight').innerText()).toBe('4.20\u00a0kg');
      expect(await page.getByText('300 × 200 × 150\u00a0mm').count()).toBe(1);
      await page.locator('[data-document="certificate"][data-state="ready"]').waitFor({ timeout: 60_000 });
      await page.locator('[data-document="packing_list"][data-state="ready"]').waitFor({ timeout: 60_000 });
      shipment = await getJson<ShipmentRecord>(page, `/api/shipments/${shipmentId}`);
      expect(shipment).toMatchObject({ trackingNumber: tracking, carrier: 'Harrow Parcel', customer: { id: c.id } });
      expect(shipment.totalWeight).toBeCloseTo(4.2, 9);
      expect(shipment.packageList[0]).toMatchObject({ length: 300, width: 200, height: 150 });
      expect(shipment.items.map((i) => i.workOrderId)).toEqual([w.id]);
      await screenshot(page, 'shipment-page');
      const certHref = await page.locator('[data-document="certificate"] a').getAttribute('href');
      expect(await fetchPdf(page, certHref!)).toMatchObject({ status: 200, type: 'application/pdf', head: '%PDF-' });

      // The shipments list finds it by its tracking number.
      await openFromNav(page, 'Shipments');
      await page.getByRole('link', { name: shipment.number }).waitFor();
      await page.getByLabel('Search shipments').fill(tracking);
      expect(await page.getByTestId('row-count').innerText()).toMatch(/^1 of \d+ shipments shown$/);
      await screenshot(page, 'shipments-list', { fullPage: false });

      expect(pageErrors, 'uncaught errors in the page').toEqual([]);
    } finally {
      await context.close();
    }

    // The customer: the order's line shipped, the tracking number, the certificate.
    const cust = await openPage(browser, { width: 1280, height: 800 });
    try {
      await signInAs(cust.page, email);
      expect(await navOffers(cust.page, 'Ready to ship')).toBe(false);
      const card = cust.page.locator(`[data-order="${shipment.orders[0].number}"]`);
      await card.waitFor();
      await card.getByRole('link', { name: `Order ${shipment.orders[0].number}` }).click();
      await cust.page.waitForURL(`**/portal/orders/${orderId}`);
      const sh = cust.page.locator(`[data-shipment="${shipment.number}"]`);
      await sh.waitFor();
      expect(await sh.getByTestId('tracking-number').innerText()).toBe(shipment.trackingNumber);
      const detail = await getJson<PortalOrderDetail>(cust.page, `/api/portal/orders/${orderId}`);
      const line = detail.lines.find((l) => l.id === lineId)!;
      expect(line.progress.shipped).toBeGreaterThanOrEqual(shipment.units);
      const lineEl = cust.page.locator(`[data-line-no="${line.lineNo}"]`);
      expect(await lineEl.getByTestId('line-summary').innerText()).toMatch(/shipped/i);
      expect(await lineEl.locator('[data-progress]').getAttribute('data-progress')).toContain(`shipped:${line.progress.shipped}`);
      // Nothing internal: no floor staff or who recorded the shipment.
      expect(await cust.page.getByText(shipment.createdBy?.name ?? '\u0000none').count()).toBe(0);
      const cert = sh.getByRole('link', { name: /Certificate of conformance/ });
      await cert.waitFor();
      expect(await fetchPdf(cust.page, (await cert.getAttribute('href'))!)).toMatchObject({ status: 200, type: 'application/pdf', head: '%PDF-' });
      await screenshot(cust.page, 'portal-order');
      await cust.page.goto('/');
      await cust.page.locator(`[data-order="${shipment.orders[0].number}"]`).waitFor();
      await screenshot(cust.page, 'portal-home', { fullPage: false });
      expect(cust.pageErrors).toEqual([]);
    } finally {
      await cust.context.close();
    }

    // The same order page on a phone.
    const phone = await openPage(browser, { width: 390, height: 844 });
    try {
      await signInAs(phone.page, email);
      await phone.page.goto(`/portal/orders/${orderId}`);
      await phone.page.locator(`[data-shipment="${shipment.number}"]`).waitFor();
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow, 'no sideways scrolling on a phone').toBeLessThanOrEqual(0);
      await screenshot(phone.page, 'portal-order-phone');
      expect(phone.pageErrors).toEqual([]);
    } finally {
      await phone.context.close();
    }
  });
});
