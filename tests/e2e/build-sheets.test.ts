/**
 * The engineer's desk, in a real browser against the real server, database and coil engine (no
 * stubbed answers): the engineer opens a waiting line from the engineering queue, runs *find
 * wire*, adopts the best size, saves the draft, approves it (giving an override reason when the
 * server asks for one), checks the stock, releases, and sees the work orders. Screenshots of the
 * sheet with its pictures go to test-results/screenshots/.
 *
 * Check values: the numbers on the page are compared with what the server's own engine answers
 * for the same spec (POST /api/coil/calculate), fetched in the test through the page's session;
 * the work-order number pattern and the 'ready' stage come from src/contracts/work-orders.ts and
 * stages.ts. 1 in = 25.4 mm exactly (NIST SP 811 appendix B).
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BuildSheetRecord, EngineeringQueueItem, OrderLineDetail } from '../../src/contracts/build-sheets';
import type { CoilSpec } from '../../src/contracts/coil';
import { WORK_ORDER_NUMBER_PATTERN, type WorkOrderSummary } from '../../src/contracts/work-orders';
import { launch, openFromNav, openPage, screenshot, signIn, textOf } from './helpers';

const CSRF = { 'X-Requested-By': 'spoolwright' };

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function getJson<T>(page: Page, path: string): Promise<T> {
  const res = await page.request.get(path);
  expect(res.status(), `GET ${path}`).toBe(200);
  return (await res.json()) as T;
}

async function postJson<T>(page: Page, path: string, data: unknown): Promise<T> {
  const res = await page.request.post(path, { data, headers: CSRF });
  expect(res.status(), `POST ${path}: ${await res.text()}`).toBeLessThan(300);
  return (await res.json()) as T;
}

/** Waits until the sheet has caught up with the form (debounce over, no request in flight). */
async function settled(page: Page) {
  await page.waitForFunction(() => document.querySelector('[data-testid="calculating"]')?.textContent?.includes('up to date'));
}

// textOf collapses white space, the no-break space between a number and its unit included.
const digits = (s: string) => Number(s.replace(/[^\d]/g, ''));

/** A waiting line whose order is acknowledged (so it can be released); one with a pull target if there is one, for the pictures. */
async function pickLine(page: Page): Promise<OrderLineDetail> {
  const { lines } = await getJson<{ lines: EngineeringQueueItem[] }>(page, '/api/engineering/queue');
  const open = lines.filter((l) => l.order.status === 'acknowledged' && (l.latestSheet === null || l.latestSheet.status === 'draft'));
  expect(open.length, 'the demo seed leaves acknowledged lines waiting for engineering').toBeGreaterThan(0);
  const details: OrderLineDetail[] = [];
  for (const l of open.slice(0, 8)) details.push(await getJson<OrderLineDetail>(page, `/api/order-lines/${l.lineId}`));
  const withTarget = details.filter((d) => d.starting.target !== null);
  expect(withTarget.length, 'a waiting line with a solver target').toBeGreaterThan(0);
  return withTarget.find((d) => d.requirement.target.kind === 'pull' && d.requirement.magneticCircuit) ?? withTarget[0];
}

describe('engineer drafts, approves and releases a build sheet', () => {
  it('goes from the queue to work orders with the engine’s own numbers', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1366, height: 900 });
    try {
      await signIn(page, 'engineer');
      // The engineer's home lists what waits, and the navigation has the queue.
      await page.getByRole('heading', { name: 'Waiting for engineering' }).waitFor();
      await openFromNav(page, 'Engineering');
      await page.getByRole('heading', { name: 'Engineering queue' }).waitFor();

      // The queue is oldest due first.
      const queue = (await getJson<{ lines: EngineeringQueueItem[] }>(page, '/api/engineering/queue')).lines;
      const dues = queue.map((l) => l.dueDate);
      expect(dues).toEqual([...dues].sort());
      const shownFirst = await textOf(page, 'tbody tr:first-child a[data-line-link]');
      expect(shownFirst).toBe(`${queue[0].order.number} / ${queue[0].lineNo}`);
      await screenshot(page, 'engineering-queue');

      const line = await pickLine(page);
      await page.locator(`a[data-line-link="${line.id}"]`).click();
      await page.waitForURL((u) => u.pathname === `/engineering/lines/${line.id}`);
      await page.getByRole('heading', { name: 'Customer’s requirement' }).waitFor();
      await page.locator('[data-testid="sheet-turns"]').waitFor();
      await settled(page);

      // The requirement shows in the user's units (mm by default): the traverse as the server states it, × 1000.
      const traverseMm = (line.requirement.bobbin.length * 1000).toFixed(2);
      expect(await textOf(page, '[data-testid="requirement"]')).toContain(`traverse ${traverseMm} mm`);

      // Find wire: ranked sizes and the reasons others fail.
      await page.getByRole('button', { name: 'Find wire' }).click();
      await page.locator('[data-testid="find-wire"]').waitFor();
      const solved = await postJson<{ best: { wire: { size: CoilSpec['wire'] } } | null; rejected: unknown[] }>(page, '/api/coil/solve', {
        spec: line.sheets[0]?.spec ?? line.starting.spec,
        target: line.starting.target,
      });
      const candidates = page.locator('[data-testid="find-wire"] tr[data-candidate]');
      expect(await candidates.count()).toBeGreaterThan(0);
      const best = (await candidates.first().getAttribute('data-candidate'))!;
      if (solved.best && solved.best.wire.size.standard === 'AWG') {
        // Same spec as the page's starting form: the page ranks the engine's best first.
        expect(best).toBe(`AWG ${solved.best.wire.size.gauge}`);
      }
      if (solved.rejected.length > 0) {
        await page.getByText(/rejected — why/).click();
        expect(await page.locator('[data-testid="rejected"] li').count()).toBe(solved.rejected.length);
      }

      // Adopt the best size: the form and, after the server's answer, the sheet follow.
      await candidates.first().getByRole('button', { name: /^Adopt/ }).click();
      await page.waitForFunction((label) => document.querySelector('[data-testid="sheet-wire"]')?.textContent?.includes(label), best);
      await settled(page);
      const turnsShown = digits(await textOf(page, '[data-testid="sheet-turns"]'));
      expect(turnsShown).toBeGreaterThan(0);

      // The sweep row of the adopted size is marked in use and agrees with the sheet.
      const sweepRow = page.locator(`[data-testid="sweep"] tbody tr:has([data-size="${best}"])`);
      expect((await sweepRow.innerText()).toLowerCase()).toContain('in use');
      expect(digits(await sweepRow.locator('td').nth(1).innerText())).toBe(turnsShown);

      // Save the draft.
      const saved = page.waitForResponse((r) => r.url().endsWith(`/api/order-lines/${line.id}/build-sheet`) && r.request().method() === 'POST');
      await page.getByRole('button', { name: /^Save as draft version/ }).click();
      const savedRes = await saved;
      expect(savedRes.status()).toBe(201);
      const record = (await savedRes.json()) as BuildSheetRecord;
      expect(record.status).toBe('draft');
      await page.getByText(`Saved as version ${record.version} (draft).`).waitFor();

      // The numbers on the page are the engine's for the same spec, asked afresh through this session.
      const fresh = await postJson<{ turns: number; resistance20: number; wire: { size: CoilSpec['wire'] } }>(page, '/api/coil/calculate', record.spec);
      expect(fresh.turns).toBe(turnsShown);
      expect(record.result.turns).toBe(turnsShown);
      const r20Text = await textOf(page, '[data-testid="sheet-r20"]');
      const r20Shown = Number(r20Text.replace(/[^\d.]/g, ''));
      expect(Math.abs(r20Shown - fresh.resistance20) / fresh.resistance20).toBeLessThan(0.001);

      // The pictures are drawn from these numbers.
      for (const id of ['picture-section', 'picture-warmup', 'picture-field']) await page.locator(`[data-testid="${id}"] svg[role="img"]`).waitFor();
      const sectionLabel = (await page.locator('[data-testid="picture-section"] svg[role="img"]').getAttribute('aria-label')) ?? '';
      expect(sectionLabel).toContain(`traverse ${traverseMm}\u00a0mm`);
      if (record.spec.magneticCircuit && record.spec.magneticCircuit.gapCount > 0) {
        await page.locator('[data-testid="picture-pull"] svg[role="img"]').waitFor();
        expect(await textOf(page, '[data-testid="picture-pull"]')).toContain('Not a lifting rating');
      }
      // The saved version is shown as its record: corners, duty, switch-off and band from the engine.
      await page.locator('[data-testid="sheet-record"]').waitFor();
      expect(await page.locator('[data-testid="sheet-corners"] tr[data-corner]').count()).toBe(3);
      const lowShown = await textOf(page, '[data-testid="sheet-corners"] tr[data-corner="low"]');
      const low = (record.result as unknown as { corners: { low: { ampereTurns: number } } }).corners.low;
      expect(lowShown.replace(/[\s\u00a0]/g, '')).toContain(`${Math.round(low.ampereTurns).toLocaleString('en-GB')}A·turns`);
      for (const id of ['sheet-duty', 'sheet-switch-off', 'sheet-band']) await page.locator(`[data-testid="${id}"]`).waitFor();
      expect(await page.locator('[data-caution="stored-charge"]').count()).toBe(1);
      if (record.spec.magneticCircuit) await page.locator('[data-testid="picture-bh"] svg[role="img"]').waitFor();
      await page.getByText(/^Assumptions and sources/).click();
      expect(await page.locator('[data-testid="assumptions"] tbody tr').count()).toBeGreaterThan(3);
      await screenshot(page, 'build-sheet-draft');

      // Approve. When the sheet carries an override warning the server refuses without a reason (422 beside the field).
      const approveButton = page.getByRole('button', { name: `Approve version ${record.version}` });
      if (record.overrideNeededFor.length > 0) {
        const refused = page.waitForResponse((r) => r.url().endsWith(`/api/build-sheets/${record.id}/approve`));
        await approveButton.click();
        expect((await refused).status()).toBe(422);
        await page.locator('[data-testid="override-reason-error"]').waitFor();
        await page.getByLabel('Override reason').fill('Intermittent duty confirmed with the customer; see the order notes.');
      }
      const approved = page.waitForResponse((r) => r.url().endsWith(`/api/build-sheets/${record.id}/approve`));
      await approveButton.click();
      expect((await approved).status()).toBe(200);

      // Release: the stock check first; short stock needs a note.
      await page.getByRole('heading', { name: `Release version ${record.version}` }).waitFor();
      await page.locator('[data-testid="stock-check"] strong').first().waitFor();
      const check = await getJson<{ short: boolean; needed: number; available: number }>(page, `/api/build-sheets/${record.id}/stock-check`);
      expect(check.needed).toBeGreaterThan(0);
      expect(await textOf(page, '[data-testid="stock-check"]')).toContain(`${check.needed.toFixed(3)} kg`);
      if (check.short) await page.getByLabel('Short-stock note').fill('Two spools of this size arrive on Monday; wind the first batch from them.');
      await screenshot(page, 'build-sheet-approved');
      const releasing = page.waitForResponse((r) => r.url().endsWith(`/api/build-sheets/${record.id}/release`));
      await page.getByRole('button', { name: check.short ? 'Release anyway' : 'Release to the floor' }).click();
      expect((await releasing).status()).toBe(200);

      // The work orders: numbered, in stage Ready, quantities adding up to the line's.
      await page.locator('[data-testid="work-orders"] tr[data-work-order]').first().waitFor();
      const rows = page.locator('[data-testid="work-orders"] tr[data-work-order]');
      const fromApi = (await getJson<{ workOrders: WorkOrderSummary[] }>(page, `/api/work-orders?lineId=${line.id}`)).workOrders;
      expect(await rows.count()).toBe(fromApi.length);
      let total = 0;
      for (let i = 0; i < fromApi.length; i++) {
        const number = (await rows.nth(i).getAttribute('data-work-order'))!;
        expect(number).toMatch(WORK_ORDER_NUMBER_PATTERN);
        expect(fromApi.map((w) => w.number)).toContain(number);
        expect(await rows.nth(i).innerText()).toContain('Ready');
        total += digits(await rows.nth(i).locator('td').nth(1).innerText());
      }
      expect(total).toBe(line.quantity);
      expect(fromApi.every((w) => w.stage === 'ready')).toBe(true);
      await screenshot(page, 'build-sheet-released');

      // The line left the queue.
      const after = (await getJson<{ lines: EngineeringQueueItem[] }>(page, '/api/engineering/queue')).lines;
      expect(after.some((l) => l.lineId === line.id)).toBe(false);

      // The sheet at tablet width, in inches and Fahrenheit.
      const units = await page.request.patch('/api/me', { data: { lengthUnit: 'in', temperatureUnit: 'F' }, headers: CSRF });
      expect(units.status()).toBe(200);
      await page.setViewportSize({ width: 820, height: 1180 });
      await page.reload();
      await page.locator('[data-testid="sheet-turns"]').waitFor();
      await settled(page);
      const traverseIn = (line.requirement.bobbin.length / 0.0254).toFixed(4);
      expect(await textOf(page, '[data-testid="requirement"]')).toContain(`traverse ${traverseIn} in`);
      expect(await textOf(page, '[data-testid="sheet-temperature"]')).toMatch(/°F$/);
      // Shown in inches, the released spec is still exactly the saved one (nothing to save again).
      await page.getByRole('heading', { name: `Build sheet version ${record.version}` }).waitFor();
      expect(digits(await textOf(page, '[data-testid="sheet-turns"]'))).toBe(turnsShown);
      await page.locator('[data-testid="picture-section"] svg[role="img"]').waitFor();
      await screenshot(page, 'build-sheet-tablet-inches');

      // Wire stock shows the reservation (free = net − reserved, kg to 3 decimals).
      await openFromNav(page, 'Wire stock');
      await page.getByRole('heading', { name: 'Wire stock' }).waitFor();
      await page.locator('tbody tr').first().waitFor();
      const spools = (await getJson<{ spools: { reservedMass: number; netMass: number; freeMass: number }[] }>(page, '/api/spools')).spools;
      expect(spools.length).toBeGreaterThan(0);
      // Matching spools had free wire: the release reserved from them.
      if (check.available > 0) expect(spools.some((s) => s.reservedMass > 0)).toBe(true);
      expect(await page.locator('tbody').innerText()).toMatch(/\d+\.\d{3}[\s\u00a0]kg/);
      await screenshot(page, 'wire-stock');

      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('lets the office receive a spool, and keeps the engineer’s actions away from the office', async () => {
    const { context, page, pageErrors } = await openPage(browser, { width: 1280, height: 860 });
    try {
      await signIn(page, 'office');
      await page.goto('/stock');
      await page.getByRole('heading', { name: 'Wire stock' }).waitFor();
      const before = (await getJson<{ spools: unknown[] }>(page, '/api/spools')).spools.length;
      await page.getByRole('button', { name: 'Receive a spool' }).click();
      const dialog = page.getByRole('dialog');
      // The form's own check, before the server: a spool needs a supplier, a lot and a mass.
      await dialog.getByRole('button', { name: 'Receive spool' }).click();
      await dialog.getByText("Enter the supplier's lot number").waitFor();
      await dialog.getByLabel('Supplier', { exact: true }).fill('Brightwire Test Mill');
      await dialog.getByLabel('Supplier’s lot').fill('E2E-0042');
      await dialog.getByLabel('Net mass, kg').fill('12.5');
      await dialog.getByLabel('Wire size').selectOption('31');
      const created = page.waitForResponse((r) => r.url().endsWith('/api/spools') && r.request().method() === 'POST');
      await dialog.getByRole('button', { name: 'Receive spool' }).click();
      expect((await created).status()).toBe(201);
      await page.getByText(/Received AWG 31 copper, lot E2E-0042: 12\.500[\s\u00a0]kg/).waitFor();
      const after = (await getJson<{ spools: unknown[] }>(page, '/api/spools')).spools.length;
      expect(after).toBe(before + 1);
      await page.getByRole('cell', { name: 'E2E-0042' }).waitFor();

      // The office reads a line's desk but gets no save, approve or release.
      const { lines } = await getJson<{ lines: EngineeringQueueItem[] }>(page, '/api/engineering/queue');
      await page.goto(`/engineering/lines/${lines[0].lineId}`);
      await page.locator('[data-testid="sheet-turns"]').waitFor();
      expect(await page.getByRole('button', { name: /^Save as draft/ }).count()).toBe(0);
      expect(await page.getByRole('button', { name: /^Approve/ }).count()).toBe(0);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
