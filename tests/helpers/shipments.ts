import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { expect } from 'vitest';
import { csrf, type testApp } from './app';
import { moveOk, newStation } from './floor';
import { inDays } from './orders';
import { recordTest, workOrdersInTesting } from './test-records';

type T = ReturnType<typeof testApp>;
type Agent = Awaited<ReturnType<T['signIn']>>;
export type PackedWo = Awaited<ReturnType<typeof workOrdersInTesting>>[number] & { serials: string[] };

let n = 0;
/** A hi-pot tester and an insulation tester, calibrated (admin), for the records the certificate lists. */
export async function testInstruments(admin: Agent) {
  const out: { id: number; name: string; serial: string; calibrationDue: string }[] = [];
  for (const kind of ['hipot_tester', 'insulation_tester'] as const) {
    n += 1;
    const res = await admin
      .post('/api/instruments')
      .set(csrf)
      .send({ name: `Test ${kind.replace('_', ' ')} ${n}`, kind, serial: `SHIP-${process.pid}-${Date.now().toString(36)}-${n}`, calibrationDue: inDays(200) });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    out.push(res.body.instrument);
  }
  return out;
}

/**
 * Hi-pot for a 24 V coil: 1000 V + 2 × 24 V = 1048 V for 60 s (the shop's default rule in
 * TEST_DEFAULTS, common practice, no published source), insulation resistance 2 GΩ at 500 V.
 */
export const HIPOT = { voltage: 1048, seconds: 60, leakage: 0.0006, breakdown: false };
export const INSULATION = { voltage: 500, resistance: 2e9 };

/**
 * Work orders of 25 units (one order, one line) walked to packing by the foreman: every unit
 * tested and passed (R20 on nominal, hi-pot, insulation resistance, with the instruments), then
 * inspection and packing (the foreman's move out of inspection is the inspection signature).
 */
export async function packedWorkOrders(t: T, foreman: Agent, companyId: number, count: number, lot: string, stationId: number, instrumentIds: number[], opts: { stopAt?: 'testing' } = {}) {
  const wos = await workOrdersInTesting(t, foreman, companyId, count, lot, stationId);
  const out: PackedWo[] = [];
  for (const w of wos) {
    const serials = Array.from({ length: w.quantity }, (_, u) => `${w.number}-${String(u + 1).padStart(3, '0')}`);
    if (opts.stopAt !== 'testing') {
      for (const [u, serial] of serials.entries()) {
        // Readings spread a little around nominal (within ±1 %), all at 20 °C so R = R20.
        const res = await recordTest(foreman, w.id, { serial, resistance: w.nominal * (1 + ((u % 5) - 2) / 400), temperature: 20, hipot: HIPOT, insulationResistance: INSULATION, instrumentIds });
        expect(res.status, JSON.stringify(res.body)).toBe(201);
        expect(res.body.passed, JSON.stringify(res.body.reasons)).toBe(true);
      }
      await moveOk(foreman, w.id, 'inspection');
      await moveOk(foreman, w.id, 'packing');
    }
    out.push({ ...w, serials });
  }
  return out;
}

/** A station for the floor walk (admin). */
export const testStation = (admin: Agent) => newStation(admin);

/** A valid shipment body for work orders. */
export const shipmentBody = (workOrderIds: number[], over: Record<string, unknown> = {}) => ({
  workOrderIds,
  shipTo: { line1: '5 Test Quay', line2: '', city: 'Testhaven', region: '', postalCode: 'TH1 1AA', country: 'Estvaria' },
  attention: 'Goods in',
  carrier: 'Test Carrier',
  service: 'Next day',
  trackingNumber: `TRK-${process.pid}-${Date.now().toString(36)}-${++n}`,
  packages: [{ weight: 4.2, length: 400, width: 300, height: 200 }],
  shipDate: inDays(0),
  packingNote: 'Bagged in tens.',
  ...over,
});

/** The text of a PDF (poppler's pdftotext). */
export function pdfText(pdf: Buffer, name = 'doc.pdf') {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'spoolwright-ship-'));
  const file = path.join(dir, name);
  writeFileSync(file, pdf);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

/** Collects a binary response body (supertest) into a Buffer. */
export const binary = (res: NodeJS.ReadableStream & { setEncoding(e: string): void }, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  res.on('end', () => cb(null, Buffer.concat(chunks)));
};
