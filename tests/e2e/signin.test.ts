/**
 * Sign-in and the role homes, in a real browser against the real server and database:
 * every role signs in through the form and lands on its own home; the admin creates a user.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLE_LABELS, ROLES, type Role } from '../../src/contracts/roles';
import { DEMO_PASSWORD, demoEmail, fillSignIn, launch, navOffers, openFromNav, openPage, screenshot, signIn, signOut, textOf } from './helpers';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

/** Something on each home that only that role's home shows. */
const ROLE_MARK: Record<Role, string> = {
  admin: 'Service health',
  office: 'Enter customer orders',
  engineer: 'Thermal classes (IEC 60085)',
  foreman: 'Assign and reassign jobs',
  floor: 'Your work at the bench',
  shipping: 'certificate of conformance',
  customer: 'It is read-only',
};

async function withPage<T>(fn: (page: Page) => Promise<T>, size?: { width: number; height: number }): Promise<T> {
  const { context, page, pageErrors } = await openPage(browser, size);
  try {
    const result = await fn(page);
    expect(pageErrors, 'uncaught errors in the page').toEqual([]);
    return result;
  } finally {
    await context.close();
  }
}

describe('each role signs in and sees its own home', () => {
  it.each(ROLES)('%s', async (role) => {
    await withPage(async (page) => {
      await signIn(page, role);
      expect(new URL(page.url()).pathname).toBe('/');
      await page.locator(`[data-home="${role}"]`).waitFor();
      // Only one home is drawn, and it is this role's.
      expect(await page.locator('[data-home]').count()).toBe(1);
      expect(await textOf(page, 'h1')).toMatch(/^Welcome, \S+/);
      await page.getByText(ROLE_MARK[role], { exact: false }).first().waitFor();
      for (const other of ROLES.filter((r) => ROLE_MARK[r] !== ROLE_MARK[role])) {
        expect(await page.getByText(ROLE_MARK[other], { exact: false }).count(), `${role} home shows ${other}'s "${ROLE_MARK[other]}"`).toBe(0);
      }
      // The user menu names the role; navigation offers Users to admins only.
      expect(await textOf(page, 'header [data-user-menu] button[aria-expanded]')).toContain(ROLE_LABELS[role]);
      expect(await navOffers(page, 'Users')).toBe(role === 'admin');
      if (role === 'admin') {
        // Live health from /api/health: four services, each with a word and a shape.
        await page.locator('[data-check="storage"] [data-status]').filter({ hasText: /Working|Down/ }).waitFor();
        expect(await page.locator('[data-check] [data-status="good"]').count()).toBe(4);
        await page.getByTestId('user-count').waitFor();
        expect(Number(await textOf(page, '[data-testid="user-count"]'))).toBeGreaterThanOrEqual(ROLES.length);
      }
      await screenshot(page, `${role}-home`);
    }, ['floor', 'foreman', 'shipping'].includes(role) ? { width: 1024, height: 768 } : undefined);
  });
});

describe('sign-in form', () => {
  it('shows field messages beside the fields, and the server’s 401 message', async () => {
    await withPage(async (page) => {
      await page.goto('/sign-in');
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByText('Enter your e-mail address').waitFor();
      await page.getByText('Enter your password').waitFor();
      expect(await page.getByLabel('E-mail').getAttribute('aria-invalid')).toBe('true');
      await screenshot(page, 'sign-in-empty');

      await fillSignIn(page, `nobody-${Date.now()}@spoolwright.test`, 'not-the-password');
      await page.getByRole('alert').filter({ hasText: 'E-mail or password is not right' }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/sign-in');
      await screenshot(page, 'sign-in-401');
    });
  });

  it('shows the 429 message after repeated failures', async () => {
    await withPage(async (page) => {
      await page.goto('/sign-in');
      const email = `guesser-${Date.now()}@spoolwright.test`;
      let seen = '';
      for (let i = 0; i < 8 && !seen.includes('Too many'); i++) {
        await fillSignIn(page, email, `wrong-${i}-password`);
        const alert = page.getByRole('alert').filter({ hasText: /not right|Too many/ });
        await alert.waitFor();
        await page.getByRole('button', { name: 'Sign in' }).and(page.locator(':not([disabled])')).waitFor();
        seen = await alert.first().innerText();
      }
      expect(seen).toMatch(/Too many failed sign-ins/);
    });
  });

  it('a deep link while signed out comes back after sign-in; a refused role gets the 403 page', async () => {
    await withPage(async (page) => {
      await page.goto('/users?from=link');
      await page.waitForURL((u) => u.pathname === '/sign-in');
      expect(new URL(page.url()).searchParams.get('next')).toBe('/users?from=link');
      await fillSignIn(page, demoEmail('admin'), DEMO_PASSWORD);
      await page.waitForURL((u) => u.pathname === '/users');
      await page.getByRole('heading', { name: 'Users', level: 1 }).waitFor();
      await signOut(page);

      await signIn(page, 'office');
      await page.goto('/users');
      await page.getByRole('heading', { name: 'Not for your role' }).waitFor();
      await page.goto('/no/such/page');
      await page.getByRole('heading', { name: 'No such page' }).waitFor();
      expect(await textOf(page, 'main')).toContain('/no/such/page');
    });
  });
});

describe('user menu', () => {
  it('saves unit preferences and shows values in them at once', async () => {
    await withPage(async (page) => {
      await signIn(page, 'shipping');
      const example = page.locator('[data-home] p', { hasText: 'Measurements show in your units' });
      const shows = (text: string) => page.waitForFunction((t) => document.querySelector('[data-home]')?.textContent?.includes(t), text);
      const menu = page.getByRole('group', { name: 'Account' });
      const choose = async (label: string) => {
        const radio = menu.getByLabel(label);
        await radio.click();
        await page.waitForFunction((el) => (el as HTMLInputElement).checked, await radio.elementHandle());
      };
      await page.getByRole('button', { name: /Account menu/ }).click();
      try {
        // From a known start (an earlier run may have left other units).
        await choose('Millimetres (mm)');
        await choose('Celsius (°C)');
        await shows('25.40\u00a0mm');
        await choose('Inches (in)');
        await choose('Fahrenheit (°F)');
        await shows('68.0\u00a0°F'); // 20 °C
        expect(await example.innerText()).toContain('1.0000\u00a0in'); // 25.4 mm
        expect(await example.innerText()).toContain('72.0\u00a0°F'); // a 40 K rise
        await screenshot(page, 'shipping-menu', { fullPage: false });
        // Saved on the server: a reload keeps them.
        await page.reload();
        await example.waitFor();
        expect(await example.innerText()).toContain('1.0000\u00a0in');
        expect(await example.innerText()).toContain('68.0\u00a0°F');
      } finally {
        if (!(await menu.isVisible())) await page.getByRole('button', { name: /Account menu/ }).click();
        await choose('Millimetres (mm)');
        await choose('Celsius (°C)');
        await shows('20.0\u00a0°C');
      }
    });
  });
});

describe('Users screen (admin)', () => {
  it('creates a user who then shows in the table', async () => {
    await withPage(async (page) => {
      await signIn(page, 'admin');
      await openFromNav(page, 'Users');
      await page.waitForURL((u) => u.pathname === '/users');
      await page.locator('table tbody tr').first().waitFor();
      const before = await page.locator('table tbody tr').count();
      expect(before).toBeGreaterThanOrEqual(ROLES.length);

      const stamp = Date.now();
      const email = `winder-${stamp}@spoolwright.test`;
      const name = `Testa Windgrave ${stamp}`;
      await page.getByRole('button', { name: 'New user' }).click();
      const dialog = page.getByRole('dialog', { name: 'New user' });
      await dialog.getByLabel('Name').fill(name);
      await dialog.getByLabel('E-mail').fill(email);
      await dialog.getByLabel('Role').selectOption('floor');
      // Too short first: the contract's message shows beside the field, nothing is sent.
      await dialog.getByLabel('Password').fill('short');
      await dialog.getByRole('button', { name: 'Create user' }).click();
      await dialog.getByText('At least 10 characters').first().waitFor();
      await dialog.getByLabel('Password').fill('a-long-enough-password');
      await dialog.getByRole('button', { name: 'Create user' }).click();
      await dialog.waitFor({ state: 'hidden' });

      const row = page.locator('table tbody tr', { hasText: email });
      await row.waitFor();
      expect(await row.innerText()).toContain(name);
      expect(await row.innerText()).toContain('Floor');
      expect(await row.innerText()).toContain('Active');
      // Other suites may add users to the shared test database meanwhile: at least one more row.
      expect(await page.locator('table tbody tr').count()).toBeGreaterThan(before);

      // The same address again: the server's 409 shows beside the e-mail field.
      await page.getByRole('button', { name: 'New user' }).click();
      await dialog.getByLabel('Name').fill('Second Try');
      await dialog.getByLabel('E-mail').fill(email);
      await dialog.getByLabel('Password').fill('a-long-enough-password');
      await dialog.getByRole('button', { name: 'Create user' }).click();
      await dialog.getByText('Already in use').waitFor();
      await dialog.getByRole('button', { name: 'Cancel' }).click();

      // The search narrows the table to the new user.
      await page.getByLabel('Search users').fill(email);
      await page.getByTestId('row-count').filter({ hasText: /^1 of \d+ users shown$/ }).waitFor();
      expect(await page.locator('table tbody tr').count()).toBe(1);
      await page.getByLabel('Search users').fill('');
      await screenshot(page, 'admin-users');
    });
  });

  it('shows the 422 last-admin refusal beside the field and in words', async () => {
    await withPage(async (page) => {
      await signIn(page, 'admin');
      await page.goto('/users');
      // The global setup reset the database: the demo admin is the only active admin, so the
      // real rule answers (and, were it broken, this run's demotion is undone by the next reset).
      let patched = 0;
      page.on('response', (r) => {
        if (r.request().method() === 'PATCH' && /\/api\/users\/\d+$/.test(r.url()) && r.status() === 422) patched++;
      });
      const adminRow = page.locator('table tbody tr', { hasText: 'admin@spoolwright.test' });
      await adminRow.getByRole('button', { name: /Change role of/ }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('New role').selectOption('office');
      await dialog.getByRole('button', { name: 'Change role' }).click();
      await dialog.getByRole('alert').filter({ hasText: 'The shop must keep at least one active admin' }).waitFor();
      await dialog.getByText('This is the last active admin').waitFor();
      expect(await dialog.getByLabel('New role').getAttribute('aria-invalid')).toBe('true');
      expect(patched).toBe(1);
      await screenshot(page, 'admin-users-last-admin', { fullPage: false });
    });
  });
});
