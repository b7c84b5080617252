import { PDFDocument } from 'pdf-lib';
import { afterAll, describe, expect, it } from 'vitest';
import { ensureTraveler } from '../../server/travelers/service';
import { notInArray } from 'drizzle-orm';
import { travelers, workOrders } from '../../server/db/schema';
import { csrf, testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

describe('shop settings', () => {
  it('the admin reads and changes them; a bad value names its field; nothing half-saved', async () => {
    const admin = await t.signIn('admin');
    const before = (await admin.get('/api/settings')).body.settings;
    expect(before).toMatchObject({ unitsPerWorkOrder: 25, scrapAllowancePercent: 5, paper: 'A4' });
    expect(before.name).toBe('Larkspur Coil Works'); // the demo seed's shop

    const bad = await admin.patch('/api/settings').set(csrf).send({ name: 'Other name', unitsPerWorkOrder: 0, paper: 'B5' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['paper', 'unitsPerWorkOrder']);
    expect((await admin.get('/api/settings')).body.settings.name).toBe(before.name);

    const floorUser = await t.signIn('floor');
    expect((await floorUser.get('/api/settings')).status).toBe(200);
    expect((await floorUser.patch('/api/settings').set(csrf).send({ name: 'x' })).status).toBe(403);
  });

  it('Letter paper prints travelers on US Letter, 612 × 792 pt', async () => {
    const admin = await t.signIn('admin');
    // A work order that has no traveler yet (so this one is drawn now, on the new paper).
    const [wo] = await t.deps.db.select().from(workOrders).where(notInArray(workOrders.id, t.deps.db.select({ id: travelers.workOrderId }).from(travelers))).limit(1);
    try {
      const res = await admin.patch('/api/settings').set(csrf).send({ paper: 'LETTER', stageStandardTimes: { curing: { minutesPerUnit: 0, minutesPerBatch: 90 } } });
      expect(res.status).toBe(200);
      expect(res.body.settings.paper).toBe('LETTER');
      expect(res.body.settings.stageStandardTimes.curing.minutesPerBatch).toBe(90);
      expect(res.body.settings.stageStandardTimes.testing).toBeTruthy(); // the others kept
      const traveler = await ensureTraveler(t.deps.db, t.deps.storage, t.deps.config.publicUrl, wo.id, 1);
      const pdf = await PDFDocument.load(await t.deps.storage.getBuffer(traveler.storageKey));
      const { width, height } = pdf.getPage(0).getSize();
      // US Letter is 8.5 × 11 in = 612 × 792 pt at 72 pt/in (ANSI/ASME Y14.1 size A).
      expect(traveler.paper).toBe('LETTER');
      expect([Math.round(width), Math.round(height)]).toEqual([612, 792]);
    } finally {
      await admin.patch('/api/settings').set(csrf).send({ paper: 'A4', stageStandardTimes: { curing: { minutesPerUnit: 0, minutesPerBatch: 120 } } });
    }
  });
});
