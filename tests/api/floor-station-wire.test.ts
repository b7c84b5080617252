/**
 * A winder's wire-size range against the work it is given: assigning work to a winder, and the
 * winding record's station, are refused (422, rule station_wire_range, fields.stationId) when the
 * work order's wire lies outside the range; the edges are inclusive. The winding record's spool
 * lot must be of the wire the work order winds.
 *
 * The wire is copper AWG 34 (tests/helpers/floor.ts). Its nominal bare diameter, 0.0063 in =
 * 0.160 mm, is ASTM B258 Table 1; the test takes the exact value from the work order's own sheet.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { wireOutsideStation } from '../../server/floor/service';
import { csrf, testApp } from '../helpers/app';
import { newCompany } from '../helpers/orders';
import { receiveSpool } from '../helpers/build-sheets';
import { move, moveOk, newStation, receiveFloorWire, releasedWorkOrders, type Wo } from '../helpers/floor';

const t = testApp();
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof t.signIn>>;
let foreman: Agent;
let admin: Agent;
let wos: Wo[];
let bare: number;
const LOT = `FLOOR-WIRE-${process.pid}`;

beforeAll(async () => {
  foreman = await t.signIn('foreman');
  admin = await t.signIn('admin');
  const office = await t.signIn('office');
  const company = await newCompany(office, []);
  await receiveFloorWire(office, LOT);
  wos = await releasedWorkOrders(t, company.id, 2, 20, 'Wire range coil');
  const detail = await foreman.get(`/api/work-orders/${wos[0]!.id}`);
  bare = detail.body.buildSheet.bareDiameter;
});

describe('wireOutsideStation', () => {
  const station = { name: 'W', wireDiameterMin: 0.2e-3, wireDiameterMax: 1.0e-3 };
  it('takes the edges, refuses either side, and a station without a range takes anything', () => {
    expect(wireOutsideStation(station, [{ number: 'A', bareDiameter: 0.2e-3 }, { number: 'B', bareDiameter: 1.0e-3 }])).toEqual([]);
    const out = wireOutsideStation(station, [{ number: 'C', bareDiameter: 0.16e-3 }, { number: 'D', bareDiameter: 1.29e-3 }]);
    expect(out.map((o) => o.number)).toEqual(['C', 'D']);
    expect(out[0]!.reason).toBe('C winds 0.16 mm wire; W takes 0.2 mm to 1 mm');
    expect(wireOutsideStation({ name: 'X', wireDiameterMin: null, wireDiameterMax: null }, [{ number: 'E', bareDiameter: 5e-3 }])).toEqual([]);
    expect(wireOutsideStation({ name: 'Y', wireDiameterMin: null, wireDiameterMax: 0.1e-3 }, [{ number: 'F', bareDiameter: 0.16e-3 }])[0]!.reason).toContain('up to 0.1 mm');
  });
});

describe('a winder’s wire-size range', () => {
  it('AWG 34 is 0.160 mm bare (ASTM B258)', () => {
    expect(bare * 1000).toBeCloseTo(0.16, 3);
  });

  it('refuses assigning work to a winder that does not take its wire, and nothing changes', async () => {
    const coarse = await newStation(admin, { wireDiameterMin: 0.2e-3, wireDiameterMax: 1.0e-3 });
    const res = await foreman.post('/api/work-orders/assign').set(csrf).send({ ids: wos.map((w) => w.id), stationId: coarse.id });
    expect(res.status).toBe(422);
    expect(res.body.error.rule).toBe('station_wire_range');
    expect(res.body.error.fields.stationId).toContain(`${wos[0]!.number} winds 0.16 mm wire`);
    const after = await foreman.get(`/api/work-orders/${wos[0]!.id}`);
    expect(after.body.stationId).not.toBe(coarse.id);
    expect(after.body.version).toBe(wos[0]!.version);
  });

  it('takes a wire exactly at the range’s edge', async () => {
    const edge = await newStation(admin, { wireDiameterMin: bare, wireDiameterMax: 0.5e-3 });
    const res = await foreman.post('/api/work-orders/assign').set(csrf).send({ ids: [wos[0]!.id], stationId: edge.id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.workOrders[0].station.id).toBe(edge.id);
  });

  it('refuses a winding record naming a winder that does not take the wire, or a lot of another wire', async () => {
    const wo = wos[1]!;
    let cur = await moveOk(foreman, wo.id, 'winding');
    // Traceability: a lot of AWG 24 cannot be what an AWG 34 job was wound from.
    const other = await receiveSpool(await t.signIn('office'), 24, 5, undefined, `OTHER-WIRE-${process.pid}`, 2);
    const wrongLot = await move(foreman, wo.id, 'terminating', { turnsCounter: 100, spoolLot: other.lot, stationId: (await newStation(admin)).id });
    expect(wrongLot.status).toBe(422);
    expect(wrongLot.body.error.fields.spoolLot).toBe(`Lot ${other.lot} is not copper AWG 34, grade 1, the wire ${wo.number} winds`);
    const coarse = await newStation(admin, { wireDiameterMin: 0.25e-3, wireDiameterMax: 1.0e-3 });
    const refused = await move(foreman, wo.id, 'terminating', { turnsCounter: 100, spoolLot: LOT, stationId: coarse.id });
    expect(refused.status).toBe(422);
    expect(refused.body.error.rule).toBe('station_wire_range');
    const fits = await newStation(admin);
    cur = await moveOk(foreman, wo.id, 'terminating', { turnsCounter: 100, spoolLot: LOT, stationId: fits.id });
    expect(cur.stage).toBe('terminating');
  });
});
