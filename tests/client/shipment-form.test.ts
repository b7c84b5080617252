// @vitest-environment node
/**
 * The new-shipment form's way to the API: typed weights and sizes in the user's units become the
 * contract's kg and mm (1 in = 25.4 mm and 1 lb = 0.453 592 37 kg exactly, NIST SP 811 appendix B),
 * the form's per-work-order entries become `workOrderIds` and `partial`, and messages about the
 * request (the contract's or the server's `fields`) land on the form entry they are about.
 */
import { describe, expect, it } from 'vitest';
import { createShipmentRequest } from '../../src/contracts/shipments';
import { emptyShipment, formPath, serverFieldsToForm, shipmentFormSchema, toRequest, type ShipmentFormValues } from '../../src/features/shipping/formModel';

const ADDRESS = { line1: '2 Fennick Lane', line2: '', city: 'Quillon Harbour', region: '', postalCode: 'QH2 1FL', country: 'Estvaria' };

function filled(): ShipmentFormValues {
  const v = emptyShipment([11, 12], ADDRESS);
  v.carrier = 'Harrow Parcel';
  v.packages = [{ weight: '10', length: '12', width: '8', height: '6' }];
  v.items[1] = { workOrderId: 12, ship: 'some', serials: ['WO-12-003', 'WO-12-001'] };
  return v;
}

describe('the shipment form → the request', () => {
  it('inch users: lb → kg and in → mm, exactly (NIST SP 811)', () => {
    const req = createShipmentRequest.parse(toRequest(filled(), 'in'));
    expect(req.packages[0].weight).toBeCloseTo(4.5359237, 12); // 10 lb
    expect(req.packages[0].length).toBeCloseTo(304.8, 9); // 12 in
    expect(req.packages[0].width).toBeCloseTo(203.2, 9); // 8 in
    expect(req.packages[0].height).toBeCloseTo(152.4, 9); // 6 in
  });

  it('metric users: kg and mm go as typed; a comma is a decimal mark', () => {
    const v = filled();
    v.packages[0].weight = '4,2';
    const req = createShipmentRequest.parse(toRequest(v, 'mm'));
    expect(req.packages[0]).toEqual({ weight: 4.2, length: 12, width: 8, height: 6 });
  });

  it('whole work orders ship whole; a work order with serials ticked ships only those', () => {
    const req = createShipmentRequest.parse(toRequest(filled(), 'mm'));
    expect(req.workOrderIds).toEqual([11, 12]);
    expect(req.partial).toEqual([{ workOrderId: 12, serials: ['WO-12-003', 'WO-12-001'] }]);
    // A lone unticked checkbox answers `false` in react-hook-form: that is no serials, and the contract says so.
    const v = filled();
    (v.items[1] as { serials: unknown }).serials = false;
    const r = shipmentFormSchema('mm').safeParse(v);
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.'))).toContain('items.1.serials');
  });

  it('the contract’s messages land on the form’s fields, limits in the user’s units', () => {
    const v = filled();
    v.carrier = '';
    v.packages[0].weight = 'heavy';
    v.packages[0].length = '500'; // in: 12 700 mm, over the contract's 10 000 mm
    const r = shipmentFormSchema('in').safeParse(v);
    expect(r.success).toBe(false);
    const byPath = Object.fromEntries(r.error!.issues.map((i) => [i.path.join('.'), i.message]));
    expect(byPath.carrier).toBe('Enter the carrier');
    expect(byPath['packages.0.weight']).toBe('Weight: enter a number');
    expect(byPath['packages.0.length']).toBe('Length: at most 393.7 in'); // 10 000 mm / 25.4
  });
});

describe('request paths → form paths', () => {
  it('maps work orders, partial entries and whole lists', () => {
    const v = filled();
    expect(formPath(['workOrderIds', 1], v)).toBe('items.1.workOrderId');
    expect(formPath(['workOrderIds'], v)).toBe('items.root');
    expect(formPath(['partial', 0, 'serials'], v)).toBe('items.1.serials'); // the first partial entry is item 1
    expect(formPath(['packages'], v)).toBe('packages.root');
    expect(formPath(['shipTo', 'city'], v)).toBe('shipTo.city');
  });

  it('a refused shipment’s reasons go beside each work order it names', () => {
    const v = filled();
    const numbers = new Map([
      [11, 'WO-26-00011'],
      [12, 'WO-26-00012'],
    ]);
    const out = serverFieldsToForm({ workOrderIds: 'WO-26-00012: Customer Ulvenfold Rail Equipment, not Quillon Dosing Works', carrier: 'Too long' }, v, numbers);
    expect(out).toEqual({ 'items.1.workOrderId': 'Customer Ulvenfold Rail Equipment, not Quillon Dosing Works', carrier: 'Too long' });
    // A reason that names no work order of the form stays above the list.
    expect(serverFieldsToForm({ workOrderIds: '#99: No such work order' }, v, numbers)).toEqual({ 'items.root': '#99: No such work order' });
  });
});
