/**
 * Recording a winding test in a real browser against the real server and the seeded demo shop:
 * a floor user opens the test bench for a work order in testing, generates serials, records a
 * passing unit and a failing one (resistance far outside tolerance), sees the server's verdicts,
 * then the work order's run chart with both points — one inside the tolerance band, one outside.
 * Screenshots: the bench at tablet sizes (1024×768 landscape, 800×1280 portrait), the work
 * order's tests, the quality view and the design feedback.
 *
 * Values: the resistance entered for the passing unit is the design's own R20 read at 20 °C (so
 * the correction is the identity, IEC 60034-1 resistance method, R20 = R·(234.5+20)/(234.5+θ));
 * the failing unit reads 1.5 × R20, +50 %, far outside any line tolerance in the demo (±5–10 %,
 * invented demo data). Hi-pot and insulation values are invented to sit well inside the shop
 * defaults (src/contracts/test-records.ts TEST_DEFAULTS, common practice).
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { WorkOrderDetail, WorkOrderSummary } from '../../src/contracts/work-orders';
import { CSRF_HEADER, CSRF_VALUE } from '../../src/contracts/errors';
import path from 'node:path';
import { DEMO_PASSWORD, fillSignIn, launch, openPage, SCREENSHOT_DIR, screenshot, signIn } from './helpers';

const TABLET = { width: 1024, height: 768 };
const PORTRAIT = { width: 800, height: 1280 };
const FLOOR_EMAIL = 'wendell@spoolwright.test';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function signInAs(page: Page, email: string) {
  await page.goto('/sign-in');
  await fillSignIn(page, email, DEMO_PASSWORD);
  await page.waitForURL((url) => url.pathname !== '/sign-in');
  await page.locator('main').first().waitFor();
}

/** The °C → user's unit conversion (NIST SP 811: °F = °C × 9/5 + 32). */
const inUserUnit = (celsius: number, unit: 'C' | 'F') => (unit === 'C' ? celsius : (celsius * 9) / 5 + 32);

let woId = 0;
let woNumber = '';
const serials: string[] = [];

describe('a floor user at the test bench', () => {
  it('records a passing and a failing unit and sees both verdicts, then both points on the run chart', async () => {
    // The foreman lists an instrument past its calibration date: the bench must show it disabled, with why.
    {
      const { context, page } = await openPage(browser);
      await signIn(page, 'foreman');
      const res = await page.request.post('/api/instruments', {
        headers: { [CSRF_HEADER]: CSRF_VALUE },
        data: { name: 'Old bench ohmmeter', kind: 'ohmmeter', serial: `E2E-OVERDUE-${Date.now()}`, calibrationDue: '2020-01-31' },
      });
      expect(res.status()).toBe(201);
      await context.close();
    }

    const { context, page, pageErrors } = await openPage(browser, TABLET);
    try {
      await signInAs(page, FLOOR_EMAIL);
      const me = (await (await page.request.get('/api/auth/me')).json()) as { user: { temperatureUnit: 'C' | 'F' } };
      const list = (await (await page.request.get('/api/work-orders?stage=testing')).json()) as { workOrders: WorkOrderSummary[] };
      expect(list.workOrders.length).toBeGreaterThan(0);
      const target = list.workOrders[0]!;
      woId = target.id;
      woNumber = target.number;
      const wo = (await (await page.request.get(`/api/work-orders/${woId}`)).json()) as WorkOrderDetail;
      const nominal = wo.buildSheet!.resistance20;

      // The bench is in the floor user's navigation; the work order is picked from those waiting.
      await page.getByRole('link', { name: 'Test bench' }).first().click();
      await page.getByTestId('test-bench').waitFor();
      await page.locator(`[data-testid="bench-work-orders"] [data-wo="${woNumber}"]`).click();
      await page.locator(`[data-testid="bench"][data-wo="${woNumber}"]`).waitFor();
      await expect(page.getByTestId('bench-hipot-caution').innerText()).resolves.toMatch(/lethal voltage/i);

      // Instruments: the overdue one is disabled and says why; a calibrated one is chosen.
      const overdue = page.locator('[data-testid="instruments"] [data-overdue="true"]').first();
      await expect(overdue.innerText()).resolves.toMatch(/overdue/i);
      expect(await overdue.locator('input').isDisabled()).toBe(true);

      // Two serials, continuing after the highest used in this work order.
      await page.getByLabel('How many').fill('2');
      await page.getByRole('button', { name: 'Generate serials' }).click();
      const chips = page.locator('[data-testid="suggested-serials"] button');
      await chips.nth(1).waitFor();
      serials.push(((await chips.nth(0).textContent()) ?? '').trim(), ((await chips.nth(1).textContent()) ?? '').trim());
      expect(serials[0]).toMatch(new RegExp(`^${woNumber}-\\d{3}$`));

      const fillUnit = async (resistance: number) => {
        await page.getByLabel('Resistance as read, Ω').fill(String(resistance));
        await page.getByLabel(/^Winding temperature/).fill(String(inUserUnit(20, me.user.temperatureUnit)));
        await page.getByLabel('Applied voltage, V').fill('4000');
        await page.getByLabel('Leakage current, mA').fill('0.4');
        await page.getByLabel('Insulation resistance, MΩ').fill('800');
        await page.locator('[data-testid="instruments"] [data-overdue="false"] input').first().check();
      };

      // Unit 1: the design's R20 at 20 °C → pass.
      await chips.nth(0).click();
      await expect(page.getByLabel('Serial number').inputValue()).resolves.toBe(serials[0]);
      await fillUnit(nominal);
      await screenshot(page, 'test-bench-form-tablet');
      await page.getByRole('button', { name: 'Record this unit' }).click();
      const verdict = page.getByTestId('bench-verdict');
      await page.locator(`[data-testid="bench-verdict"][data-serial="${serials[0]}"]`).waitFor();
      expect(await verdict.getAttribute('data-passed')).toBe('true');
      await expect(verdict.getByTestId('verdict-deviation').innerText()).resolves.toMatch(/^[+−]0\.00\s%$/);
      expect(await verdict.locator('[data-reading]').count()).toBe(3); // resistance, hi-pot, insulation resistance

      // Unit 2: the next serial is filled in; 1.5 × R20 → fail, and the server says why.
      await expect(page.getByLabel('Serial number').inputValue()).resolves.toBe(serials[1]);
      await fillUnit(Number((nominal * 1.5).toPrecision(6)));
      await page.getByRole('button', { name: 'Record this unit' }).click();
      await page.locator(`[data-testid="bench-verdict"][data-serial="${serials[1]}"]`).waitFor();
      expect(await verdict.getAttribute('data-passed')).toBe('false');
      await expect(verdict.getByTestId('verdict-deviation').innerText()).resolves.toMatch(/^\+50\.00\s%$/);
      await expect(verdict.locator('[data-reading="resistance"]').innerText()).resolves.toMatch(/outside ± ?[\d.]+ %/);
      expect(await verdict.locator('[data-reading="hipot"]').getAttribute('data-passed')).toBe('true');
      // The failed unit offers a retest.
      await page.locator(`[data-testid="bench-units"] [data-unit="${serials[1]}"]`).getByRole('button', { name: 'Retest' }).waitFor();
      await screenshot(page, 'test-bench-tablet');

      // Portrait tablet: the same bench, one column.
      await page.setViewportSize(PORTRAIT);
      await screenshot(page, 'test-bench-portrait', { fullPage: false });

      // The work order's tests: the run chart holds both units, one inside the band, one outside.
      await page.setViewportSize(TABLET);
      await page.getByRole('link', { name: `All tests of ${woNumber}` }).click();
      await page.getByTestId('work-order-tests').waitFor();
      const chart = page.getByTestId('run-chart');
      await chart.getByTestId('tolerance-band').waitFor();
      expect(await chart.locator(`[data-point="${serials[0]}"]`).getAttribute('data-outside')).toBe('false');
      expect(await chart.locator(`[data-point="${serials[1]}"]`).getAttribute('data-outside')).toBe('true');
      await expect(page.locator(`[data-testid="nonconformances"] [data-serial="${serials[1]}"]`).getAttribute('data-state')).resolves.toBe('open');
      await chart.screenshot({ path: path.join(SCREENSHOT_DIR, 'run-chart.png') });

      // Back at the bench: the failed unit is retested as a new record; it passes and says it is a retest.
      await page.getByRole('link', { name: 'Test units at the bench' }).click();
      await page.locator(`[data-testid="bench-units"] [data-unit="${serials[1]}"]`).getByRole('button', { name: 'Retest' }).click();
      await expect(page.getByLabel('Serial number').inputValue()).resolves.toBe(serials[1]);
      expect(await page.getByLabel('This is a retest of a failed unit').isChecked()).toBe(true);
      await fillUnit(nominal);
      await page.getByRole('button', { name: 'Record the retest' }).click();
      await page.locator(`[data-testid="bench-verdict"][data-serial="${serials[1]}"][data-passed="true"]`).waitFor();
      await expect(page.getByTestId('bench-verdict').innerText()).resolves.toMatch(/retest/i);
      await page.locator(`[data-testid="bench-units"] [data-unit="${serials[1]}"][data-state="passed"]`).waitFor();
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('the foreman sees the work order’s tests, the quality view; the engineer the design feedback (screenshots)', async () => {
    expect(woId).toBeGreaterThan(0);
    const { context, page, pageErrors } = await openPage(browser, { width: 1280, height: 900 });
    try {
      await signIn(page, 'foreman');
      await page.goto(`/work-orders/${woId}`);
      await page.getByTestId('work-order-tests-link').click();
      await page.getByTestId('work-order-tests').waitFor();
      await page.locator(`[data-testid="nonconformances"] [data-serial="${serials[1]}"] [data-testid="disposition-form"]`).waitFor();
      await expect(page.getByTestId('first-pass-yield').innerText()).resolves.toMatch(/%$/);
      await screenshot(page, 'work-order-tests');

      await page.getByRole('link', { name: 'Quality' }).first().click();
      await page.getByTestId('weekly-yield-chart').waitFor();
      await screenshot(page, 'quality');
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
    const eng = await openPage(browser, { width: 1280, height: 900 });
    try {
      await signIn(eng.page, 'engineer');
      await eng.page.goto('/quality/design');
      await eng.page.getByTestId('shop-heat-transfer').waitFor();
      await expect(eng.page.getByTestId('shop-h-eff').innerText()).resolves.toMatch(/W\/\(m²·K\)/);
      await screenshot(eng.page, 'design-feedback');
      expect(eng.pageErrors).toEqual([]);
    } finally {
      await eng.context.close();
    }
  });
});
