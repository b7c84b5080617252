/**
 * Running a real shop: the first admin's forced password change, and an office moving its
 * customers in from a spreadsheet (a dry run naming the bad row, then one import) — in a real
 * browser against the real server and database.
 */
import bcrypt from 'bcryptjs';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { fillSignIn, launch, openFromNav, openPage, screenshot, signIn, textOf } from './helpers';

let browser: Browser;
const pool = new pg.Pool({ connectionString: loadConfig({ ...process.env, NODE_ENV: 'test' }).databaseUrl, max: 1 });
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await pool.end();
});
const tag = `${process.pid}-${Date.now().toString(36)}`;

describe('moving in', () => {
  it('an admin whose password was chosen at set-up must choose their own before anything else', async () => {
    const email = `owner-${tag}@shop.example`;
    // As `npm run setup` leaves the first admin: a chosen password and the forced change.
    await pool.query(`insert into users (email, name, role, password_hash, must_change_password) values ($1, 'Shop Owner', 'admin', $2, true)`, [email, await bcrypt.hash('set up with this', 4)]);
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await page.goto('/sign-in');
      await fillSignIn(page, email, 'set up with this');
      await page.getByRole('heading', { name: 'Choose your own password' }).waitFor();
      expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
      await page.getByLabel('Current password').fill('set up with this');
      await page.getByLabel('New password', { exact: true }).fill('only the owner knows');
      await page.getByLabel('New password again').fill('only the owner knowz');
      await page.getByRole('button', { name: 'Save the new password' }).click();
      await page.getByText('The two new passwords differ').waitFor();
      await page.getByLabel('New password again').fill('only the owner knows');
      await page.getByRole('button', { name: 'Save the new password' }).click();
      await page.locator('[data-home="admin"]').waitFor();
      await page.getByRole('navigation', { name: 'Main' }).waitFor();
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });

  it('the office checks a customer CSV, sees the bad row, fixes it and imports everything at once', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'spoolwright-import-'));
    const header = 'company,billing_street,billing_city,billing_country,contact_name,contact_email,contact_order_notices';
    const file = path.join(dir, 'customers.csv');
    const rows = (email: string) => [header, `Brindle Actuators ${tag},3 Weir Lane,Oxhill,Nordland,Mae Brindle,mae@brindle.example,yes`, `Corven Pumps ${tag},8 Mast Road,Oxhill,Nordland,Olu Ade,${email},no`];
    writeFileSync(file, rows('olu-at-corven').join('\n'));
    const { context, page, pageErrors } = await openPage(browser);
    try {
      await signIn(page, 'office');
      await openFromNav(page, 'Import');
      await page.getByRole('heading', { name: 'Import from spreadsheets' }).waitFor();
      await page.locator('input[type=file]').setInputFiles(file);
      await page.getByText('1 of 2 rows need attention').waitFor();
      expect(await textOf(page, '[data-import-report] tbody tr:nth-child(2)')).toContain('contact_emailNot an e-mail address');
      expect(await page.getByRole('button', { name: /^Import/ }).isDisabled()).toBe(true);
      await screenshot(page, 'import-dry-run');

      writeFileSync(file, rows('olu@corven.example').join('\n'));
      await page.locator('input[type=file]').setInputFiles(file);
      await page.getByText('All 2 rows are fine').waitFor();
      await page.getByRole('button', { name: 'Import 2 customers, 2 contacts' }).click();
      await page.getByText('Created 2 customers, 2 contacts.').waitFor();
      const made = await pool.query(`select count(*)::int as n from customers where name like $1`, [`%${tag}`]);
      expect(made.rows[0].n).toBe(2);
      expect(pageErrors).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
