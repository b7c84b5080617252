/**
 * Shared browser helpers for the e2e suites: start Debian's Chromium, open a page on the test
 * server, sign in as a demo role through the real form, take screenshots.
 */
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, inject } from 'vitest';
import { startWorkers } from '../../jobs/runtime';
import { loadConfig } from '../../server/config';
import { createDeps } from '../../server/deps';
import type { Role } from '../../src/contracts/roles';
import { NAV_GROUP_LABELS, SCREENS } from '../../src/app/screens';
import { DEMO_PASSWORD, demoEmail } from '../../server/seed/demo';

export { DEMO_PASSWORD, demoEmail };

const root = path.resolve(import.meta.dirname, '..', '..');
export const SCREENSHOT_DIR = path.join(root, 'test-results', 'screenshots');

/** Debian's Chromium, headless; never a downloaded browser. */
export function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export const baseURL = () => inject('baseURL');

/** A fresh context (own cookies) and page on the test server. Office screens are desktop-sized. */
export async function openPage(
  browser: Browser,
  opts: { width?: number; height?: number } = {},
): Promise<{ context: BrowserContext; page: Page; pageErrors: string[] }> {
  const context = await browser.newContext({
    baseURL: baseURL(),
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 860 },
    locale: 'en-GB',
    timezoneId: 'UTC',
  });
  context.setDefaultTimeout(15_000);
  const page = await context.newPage();
  // Uncaught exceptions in the app: a test can assert there were none.
  const pageErrors: string[] = [];
  page.on('pageerror', (e) => pageErrors.push(e.message));
  return { context, page, pageErrors };
}

/** Signs in through the sign-in form and waits until the app has left the sign-in page. */
export async function signIn(page: Page, role: Role, opts: { next?: string } = {}) {
  await page.goto(opts.next ? `/sign-in?next=${encodeURIComponent(opts.next)}` : '/sign-in');
  await fillSignIn(page, demoEmail(role), DEMO_PASSWORD);
  // Either the app moves on, or the form says why not (that message makes the failure readable).
  const refused = page.locator('form [role="alert"]').first();
  await Promise.race([page.waitForURL((url) => url.pathname !== '/sign-in'), refused.waitFor()]);
  if (new URL(page.url()).pathname === '/sign-in') {
    throw new Error(`Sign-in as ${demoEmail(role)} was refused: ${(await refused.innerText()).replace(/\s+/g, ' ')}`);
  }
  await page.locator('main').first().waitFor();
}

export async function fillSignIn(page: Page, email: string, password: string) {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export async function signOut(page: Page) {
  await page.getByRole('button', { name: /Account menu/ }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL((url) => url.pathname === '/sign-in');
}

/** A full-page PNG in test-results/screenshots/<name>.png, after the web fonts have loaded. */
export async function screenshot(page: Page, name: string, opts: { fullPage?: boolean } = {}): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: opts.fullPage ?? true });
  return file;
}

/** The text of the first element matching a selector, trimmed. */
export async function textOf(page: Page, selector: string): Promise<string> {
  return ((await page.locator(selector).first().textContent()) ?? '').replace(/\s+/g, ' ').trim();
}

/** Whether the main navigation offers a screen, directly or in its group's menu (which it closes again). */
export async function navOffers(page: Page, label: string): Promise<boolean> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  const link = nav.getByRole('link', { name: label, exact: true });
  if ((await link.count()) > 0) return true;
  const group = SCREENS.find((s) => s.label === label && s.inNav && s.group)?.group;
  const button = group ? nav.getByRole('button', { name: NAV_GROUP_LABELS[group] }) : null;
  if (!button || (await button.count()) === 0) return false;
  await button.click();
  const offered = (await link.count()) > 0;
  await page.keyboard.press('Escape');
  return offered;
}

/**
 * Opens a screen from the main navigation by its label, as a person would: directly when the
 * role's navigation is flat, else through the menu of the screen's group.
 */
export async function openFromNav(page: Page, label: string) {
  const nav = page.getByRole('navigation', { name: 'Main' });
  const link = nav.getByRole('link', { name: label, exact: true });
  if ((await link.count()) === 0) {
    const group = SCREENS.find((s) => s.label === label && s.inNav && s.group)?.group;
    if (!group) throw new Error(`No navigation entry "${label}"`);
    await nav.getByRole('button', { name: NAV_GROUP_LABELS[group] }).click();
  }
  await link.click();
}

/**
 * The browser tests' server runs the API only: a file whose tests need background work (the
 * queues, the outbox dispatcher) starts the workers in its own process, against the same
 * services, for the length of the file.
 */
export function runWorkersDuringFile() {
  const deps = createDeps(loadConfig({ ...process.env, NODE_ENV: 'test' }));
  let workers: ReturnType<typeof startWorkers> | undefined;
  beforeAll(() => {
    workers = startWorkers(deps, { dispatchIntervalMs: 500 });
  });
  afterAll(async () => {
    await workers?.close();
    await deps.close();
  });
}
