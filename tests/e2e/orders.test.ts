/**
 * Entering a customer order, in a real browser against the real server, database and object
 * store: the office user works in inches, enters a two-line order with a drawing, meets the
 * form's messages (the browser's check first, then the server's), saves, finds the order in the
 * list and its drawing on the order page, and acknowledges it. A customer user sees only their
 * own company's orders.
 *
 * Check values: 1 in = 25.4 mm exactly (NIST SP 811 appendix B); t/°C = (t/°F − 32) × 5/9
 * (NIST SP 811 §4.2.1.1). Everything else here is invented demo input.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrderDetail, OrderSummary } from '../../src/contracts/orders';
import { launch, openFromNav, openPage, screenshot, signIn, textOf } from './helpers';

let browser: Browser;
let dir: string;
let pdfPath: string;
let pdfBytes: Buffer;

/** A small, real one-page PDF (made by pdfkit, which the server's seed uses too). */
function makePdf(): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const doc = new PDFDocument({ size: 'A6', margin: 24, info: { Title: 'E2E bobbin drawing' } });
    const chunks: Buffer[] = [];
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
    doc.fontSize(10).text('Bobbin drawing for the browser test (invented)');
    doc.rect(40, 90, 10, 80).stroke().rect(130, 90, 10, 80).stroke().rect(50, 115, 80, 30).stroke();
    doc.end();
  });
}

beforeAll(async () => {
  browser = await launch();
  dir = mkdtempSync(path.join(tmpdir(), 'spoolwright-e2e-'));
  pdfBytes = await makePdf();
  pdfPath = path.join(dir, 'coil-bobbin-drawing.pdf');
  writeFileSync(pdfPath, pdfBytes);
});
afterAll(async () => {
  await browser?.close();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** Sets the signed-in user's units through the API (as the account panel does). */
async function setUnits(page: Page, lengthUnit: 'mm' | 'in', temperatureUnit: 'C' | 'F') {
  const res = await page.request.patch('/api/me', {
    data: { lengthUnit, temperatureUnit },
    headers: { 'X-Requested-By': 'spoolwright' },
  });
  expect(res.status()).toBe(200);
}

const line = (page: Page, i: number) => page.locator(`li[data-line="${i}"]`);
const fieldMessage = async (page: Page, scope: ReturnType<typeof line> | Page, label: string) => {
  const input = scope.getByLabel(label, { exact: true });
  const id = await input.getAttribute('aria-describedby');
  return id ? (await page.locator(`[id="${id}"]`).innerText()).trim() : '';
};

describe('office enters a two-line order with a drawing, in inches', () => {
  it('checks, saves, lists, shows and acknowledges the order', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1366, height: 900 });
    try {
      await signIn(page, 'office');

      // Switch to inches and Fahrenheit on the home's account panel (saved at once via PATCH /api/me).
      const saved = page.waitForResponse((r) => r.url().endsWith('/api/me') && r.request().method() === 'PATCH');
      await page.getByLabel('Inches (in)').click();
      expect((await saved).status()).toBe(200);
      // The panel locks its choices while a change is saving; the next change waits for that to end.
      await page.waitForFunction(() => !document.querySelector('fieldset[disabled]'));
      const savedF = page.waitForResponse((r) => r.url().endsWith('/api/me') && r.request().method() === 'PATCH');
      await page.getByLabel('Fahrenheit (°F)').click();
      expect((await savedF).status()).toBe(200);
      await page.waitForFunction(() => !document.querySelector('fieldset[disabled]'));
      expect(await page.getByLabel('Inches (in)').isChecked()).toBe(true);
      expect(await page.getByLabel('Fahrenheit (°F)').isChecked()).toBe(true);

      // A purchase order the chosen customer already has: the server will refuse it (409).
      const all = (await (await page.request.get('/api/orders')).json()) as { orders: OrderSummary[] };
      const customerName = 'Quillon Dosing Works';
      const taken = all.orders.find((o) => o.customer.name === customerName);
      expect(taken, `a seeded order of ${customerName}`).toBeTruthy();
      const newPo = `QDW-E2E-${Date.now()}`;

      await openFromNav(page, 'Orders');
      await page.getByRole('link', { name: 'New order' }).first().click();
      await page.waitForURL('**/orders/new');
      await page.getByRole('heading', { name: 'New order' }).waitFor();

      await page.getByLabel('Customer', { exact: true }).selectOption({ label: customerName });
      await page.getByLabel('Customer’s purchase order').fill(taken!.purchaseOrder);
      await page.getByLabel('Requested ship date').fill('2031-03-14');
      await page.getByLabel('Internal notes').fill('Entered by the browser test.');

      // Line 1: a 24 V solenoid, 50 % duty, ampere-turns target. Two mistakes on purpose:
      // an outer diameter smaller than the inner one, and an ambient beyond the engine's range.
      const l1 = line(page, 0);
      await l1.getByLabel('Quantity (pcs)').fill('20');
      await l1.getByLabel('Title', { exact: true }).fill('Test solenoid 24 V, 50 % duty');
      await l1.getByLabel('Customer part no.').fill('QDW-E2E-1');
      await l1.getByLabel('Voltage (V)').fill('24');
      await l1.getByLabel('Duty cycle (%)').fill('50');
      await l1.getByLabel('Ambient (°F)').fill('600');
      await l1.getByLabel('Thermal class').selectOption('130');
      await l1.getByLabel('Inner diameter (in)').fill('0.5');
      await l1.getByLabel('Outer diameter (in)').fill('0.4');
      await l1.getByLabel('Traverse length (in)').fill('1.5');
      await l1.getByLabel('Ampere-turns (A)').fill('1200');

      // Line 2: current-driven, a pull at the gap of an iron circuit.
      await page.getByRole('button', { name: 'Add line' }).click();
      const l2 = line(page, 1);
      await l2.getByLabel('Quantity (pcs)').fill('5');
      await l2.getByLabel('Title', { exact: true }).fill('Test plunger coil, 12 N pull');
      await l2.getByLabel('Supply').selectOption('current');
      await l2.getByLabel('Current (A)').fill('1.5');
      await l2.getByLabel('Duty cycle (%)').fill('100');
      await l2.getByLabel('Ambient (°F)').fill('77');
      await l2.getByLabel('Inner diameter (in)').fill('0.4');
      await l2.getByLabel('Outer diameter (in)').fill('1.1');
      await l2.getByLabel('Traverse length (in)').fill('1.25');
      await l2.getByLabel('The coil must give').selectOption('pull');
      await l2.getByLabel('Pull (N)').fill('12');
      await l2.getByLabel('Relative permeability µr').fill('2000');
      await l2.getByLabel('Saturation (T)').fill('1.5');
      await l2.getByLabel('Iron path length (in)').fill('2.4');
      await l2.getByLabel('Air gap (in)').fill('0.08');
      await l2.getByLabel('Number of gaps').fill('1');
      await l2.getByLabel('Pole area (in²)').fill('0.15');
      await l2.getByLabel('Lead notes').fill('Flying leads 12 in, sleeved.');

      // The drawing, through the file picker; it waits in the queue until the order is saved.
      await page.getByTestId('file-input').setInputFiles(pdfPath);
      await page.locator('[data-upload="coil-bobbin-drawing.pdf"][data-upload-state="queued"]').waitFor();

      // Save: the browser's check (the contract schema, in SI) refuses, with messages beside the fields.
      let posted = 0;
      page.on('request', (r) => {
        if (r.method() === 'POST' && new URL(r.url()).pathname === '/api/orders') posted++;
      });
      await page.getByRole('button', { name: 'Save order' }).click();
      await page.getByText(/fields? need/).first().waitFor();
      expect(await fieldMessage(page, l1, 'Inner diameter (in)')).toBe('Inner diameter must be smaller than the outer diameter');
      expect(await fieldMessage(page, l1, 'Ambient (°F)')).toBe('Ambient: a temperature from -148 to 482\u00a0°F');
      expect(await l1.getByLabel('Inner diameter (in)').getAttribute('aria-invalid')).toBe('true');
      expect(await l2.locator('[aria-invalid="true"]').count(), 'line 2 is right').toBe(0);
      expect(posted, 'nothing is sent while the form is wrong').toBe(0);
      await screenshot(page, 'order-form-errors');

      // Fix them; the server now refuses the purchase order it already has for this customer.
      await l1.getByLabel('Outer diameter (in)').fill('1.25');
      await l1.getByLabel('Ambient (°F)').fill('104');
      await page.getByRole('button', { name: 'Save order' }).click();
      await page.getByText('This customer has an order with this purchase-order number already').waitFor();
      expect(await fieldMessage(page, page, 'Customer’s purchase order')).toBe('Already used on another order of this customer');
      expect(posted).toBe(1);
      expect(new URL(page.url()).pathname).toBe('/orders/new');

      await page.getByLabel('Customer’s purchase order').fill(newPo);
      expect(await page.getByText('This customer has an order with this purchase-order number already').count(), 'stale once edited').toBe(0);
      await screenshot(page, 'order-form');
      await page.getByRole('button', { name: 'Save order' }).click();
      await page.waitForURL(/\/orders\/\d+$/);
      const orderId = Number(new URL(page.url()).pathname.split('/').pop());

      // The order page: header, both lines in inches and °F, the drawing, awaiting engineering.
      await page.getByText(/is entered for Quillon Dosing Works/).waitFor();
      expect(await textOf(page, 'h1')).toMatch(/^Order SO-\d{4}-\d{5}$/);
      expect(await textOf(page, '[data-order-status]')).toBe('Entered');
      await page.locator('[data-attachment="coil-bobbin-drawing.pdf"]').waitFor();
      const l1Text = (await page.locator('[data-line-no="1"]').innerText()).replace(/\s+/g, ' ');
      expect(l1Text).toContain('ID 0.5000 in × OD 1.2500 in × traverse 1.5000 in');
      expect(l1Text).toContain('104.0 °F');
      expect(l1Text).toContain('50 %');
      const l2Text = (await page.locator('[data-line-no="2"]').innerText()).replace(/\s+/g, ' ');
      expect(l2Text).toContain('1 × 0.0800 in gap');
      expect(l2Text).toContain('pole area 0.15000 in²');
      expect(await page.locator('[data-build-sheet="awaiting"]').count()).toBe(2);

      // The API holds SI: 0.5 in = 0.0127 m, 104 °F = 40 °C, 0.15 in² = 9.6774e-5 m².
      const detail = ((await (await page.request.get(`/api/orders/${orderId}`)).json()) as { order: OrderDetail }).order;
      expect(detail.purchaseOrder).toBe(newPo);
      expect(detail.lines).toHaveLength(2);
      expect(detail.lines[0].requirement.bobbin.innerDiameter).toBeCloseTo(0.0127, 12);
      expect(detail.lines[0].requirement.bobbin.outerDiameter).toBeCloseTo(0.03175, 12);
      expect(detail.lines[0].requirement.ambient).toBeCloseTo(40, 9);
      expect(detail.lines[0].requirement.dutyCycle).toBeCloseTo(0.5, 12);
      expect(detail.lines[0].tolerancePercent).toBe(10);
      expect(detail.lines[1].requirement.ambient).toBeCloseTo(25, 9);
      expect(detail.lines[1].requirement.magneticCircuit?.airGap).toBeCloseTo(0.002032, 12);
      expect(detail.lines[1].requirement.magneticCircuit?.area).toBeCloseTo(0.15 * 0.0254 * 0.0254, 15);
      expect(detail.lines[1].requirement.target).toEqual({ kind: 'pull', force: 12 });

      // The drawing downloads byte for byte.
      const href = await page.locator('[data-attachment="coil-bobbin-drawing.pdf"] a[download]').getAttribute('href');
      const download = await page.request.get(href!);
      expect(download.status()).toBe(200);
      expect(download.headers()['content-type']).toBe('application/pdf');
      expect(Buffer.compare(Buffer.from(await download.body()), pdfBytes)).toBe(0);

      // A renamed program dropped on the order is refused by content, with the server's reason.
      const elf = [0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0, ...Array(56).fill(0)];
      const dt = await page.evaluateHandle((bytes) => {
        const d = new DataTransfer();
        d.items.add(new File([new Uint8Array(bytes)], 'pump-drawing.pdf', { type: 'application/pdf' }));
        return d;
      }, elf);
      await page.getByTestId('drop-zone').dispatchEvent('drop', { dataTransfer: dt });
      await page.locator('[data-upload="pump-drawing.pdf"][data-upload-state="failed"]').waitFor();
      expect(await textOf(page, '[data-upload="pump-drawing.pdf"] [role="alert"]')).toMatch(/Only PDF, PNG, JPEG, DXF, STEP files are accepted; this is a Linux program/);
      expect(await page.locator('[data-attachment]').count()).toBe(1);

      // The list: the new order is there, entered, with a link to it.
      await page.getByRole('link', { name: 'Orders', exact: true }).first().click();
      await page.waitForURL('**/orders');
      const row = page.locator('tbody tr').filter({ hasText: newPo });
      await row.waitFor();
      expect((await row.innerText()).replace(/\s+/g, ' ')).toContain('Quillon Dosing Works');
      expect(await row.locator('[data-order-status="entered"]').count()).toBe(1);
      expect(await page.locator('tbody [data-late="true"]').count(), 'the demo shop has late orders, marked').toBeGreaterThan(0);
      await screenshot(page, 'orders-list');

      // Acknowledge: the e-mail request is queued, the status moves on, the history says so.
      await row.getByRole('link').first().click();
      await page.waitForURL(`**/orders/${orderId}`);
      await page.getByRole('button', { name: 'Acknowledge…' }).click();
      await page.getByRole('dialog').getByText('An acknowledgement e-mail will be queued to').waitFor();
      await page.getByRole('dialog').getByRole('button', { name: 'Acknowledge order' }).click();
      await page.getByText(/is acknowledged\. An acknowledgement e-mail is queued to Halvard Stemmings/).waitFor();
      expect(await textOf(page, 'header [data-order-status]')).toBe('Acknowledged');
      expect(await page.getByRole('button', { name: 'Acknowledge…' }).count()).toBe(0);
      expect(await page.getByRole('link', { name: 'Edit order' }).count(), 'lines are fixed once acknowledged').toBe(0);
      await page.locator('[data-event="acknowledged"]').waitFor();
      await screenshot(page, 'order-detail');

      expect(pageErrors, 'uncaught errors in the page').toEqual([]);
    } finally {
      await setUnits(page, 'mm', 'C').catch(() => {});
      await context.close();
    }
  });
});

describe('a customer user', () => {
  it('sees only their own company’s orders, without internal notes', async () => {
    // What the office sees: every company's orders.
    const office = await openPage(browser);
    let everything: OrderSummary[];
    try {
      await signIn(office.page, 'office');
      everything = ((await (await office.page.request.get('/api/orders')).json()) as { orders: OrderSummary[] }).orders;
    } finally {
      await office.context.close();
    }
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await signIn(page, 'customer');
      const own = everything.filter((o) => o.customer.name === 'Pellridge Valve Systems');
      const other = everything.find((o) => o.customer.name !== 'Pellridge Valve Systems');
      expect(own.length).toBeGreaterThan(0);
      expect(other).toBeTruthy();

      // The customer's navigation leads to their own view (/portal); the order list still answers them by link.
      await page.goto('/orders');
      await page.getByRole('heading', { name: 'Your orders' }).waitFor();
      await page.locator('tbody tr').first().waitFor();
      expect(await textOf(page, '[data-testid="row-count"]')).toBe(`${own.length} orders`);
      const shown = await page.locator('tbody tr td:first-child').allInnerTexts();
      expect(shown.map((s) => s.trim()).sort()).toEqual(own.map((o) => o.number).sort());
      expect(await page.getByRole('link', { name: 'New order' }).count()).toBe(0);
      expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Customers' }).count()).toBe(0);
      await screenshot(page, 'customer-orders-list');

      // Their own order: no internal notes, no actions. Another company's: "No such order".
      await page.locator('tbody tr').first().getByRole('link').click();
      await page.locator('[data-order]').waitFor();
      expect(await page.getByText('Internal notes').count()).toBe(0);
      expect(await page.getByRole('button', { name: /Acknowledge|Cancel order/ }).count()).toBe(0);
      await page.goto(`/orders/${other!.id}`);
      await page.getByText('No such order').waitFor();
      expect(pageErrors, 'uncaught errors in the page').toEqual([]);
    } finally {
      await context.close();
    }
  });
});

describe('office keeps a customer’s contacts', () => {
  it('finds the company, sees its contacts and orders, adds a contact who gets order notices', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1366, height: 900 });
    try {
      await signIn(page, 'office');
      await openFromNav(page, 'Customers');
      await page.getByRole('heading', { name: 'Customers' }).waitFor();
      await page.locator('tbody tr').first().waitFor();
      await screenshot(page, 'customers-list');
      await page.getByLabel('Search customers').fill('varnholt');
      expect(await textOf(page, '[data-testid="row-count"]')).toMatch(/^1 of \d+ customers shown$/);
      await page.getByRole('link', { name: 'Varnholt Door Controls' }).click();
      await page.getByRole('heading', { name: 'Varnholt Door Controls' }).waitFor();
      await page.getByText('Wenna Caldbrook').waitFor();
      expect(await page.locator('tbody [data-order-status]').count(), 'the company’s orders').toBeGreaterThan(0);
      await screenshot(page, 'customer-detail');

      await page.getByRole('link', { name: 'Edit customer' }).click();
      await page.getByRole('heading', { name: 'Edit Varnholt Door Controls' }).waitFor();
      const before = await page.locator('[data-contact]').count();
      await page.getByRole('button', { name: 'Add contact' }).click();
      const added = page.locator(`[data-contact="${before}"]`);
      await added.getByLabel('Name', { exact: true }).fill('Ansel Brightwater');
      await added.getByLabel('Order notices').check();
      await page.getByRole('button', { name: 'Save changes' }).click();
      // A contact who gets notices needs an address: said beside the e-mail field, nothing saved.
      expect(await fieldMessage(page, added, 'E-mail')).toBe('A contact who gets notices needs an e-mail address');
      await screenshot(page, 'customer-form-errors');
      await added.getByLabel('E-mail', { exact: true }).fill('ansel.brightwater@varnholt.example');
      await page.getByRole('button', { name: 'Save changes' }).click();
      await page.getByText('Saved the changes to Varnholt Door Controls.').waitFor();
      const row = page.locator('tr').filter({ hasText: 'Ansel Brightwater' });
      expect((await row.innerText()).replace(/\s+/g, ' ')).toMatch(/ansel\.brightwater@varnholt\.example .*Order notices/);
      expect(pageErrors, 'uncaught errors in the page').toEqual([]);
    } finally {
      await context.close();
    }
  });
});
