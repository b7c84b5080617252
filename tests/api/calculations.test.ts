import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CoilSpec } from '../../src/contracts/coil';
import { designCoil, solveCoil, sweepWireSizes } from '../../server/coil';
import { calculate } from '../../server/calculations/service';
import { csrf, testApp } from '../helpers/app';

const t = testApp();
afterAll(() => t.close());

let engineer: Awaited<ReturnType<typeof t.signIn>>;
beforeAll(async () => {
  engineer = await t.signIn('engineer');
});

/** A 12 V DC valve coil on a 10/28/32 mm bobbin, AWG 28 grade 2 copper (invented demo values, SI). */
const spec = (): CoilSpec => ({
  conductor: 'copper',
  wire: { standard: 'AWG', gauge: 28 },
  insulationGrade: 2,
  bobbin: { innerDiameter: 0.01, outerDiameter: 0.028, length: 0.032 },
  pattern: 'layer',
  drive: { kind: 'voltage', volts: 12 },
  dutyCycle: 1,
  ambient: 40,
  insulationClass: 155,
});

/** What the engine returns, as it travels in JSON. */
const asJson = (x: unknown) => JSON.parse(JSON.stringify(x));

describe('coil calculation routes', () => {
  it('POST /api/coil/calculate returns designCoil’s build sheet unchanged', async () => {
    const res = await engineer.post('/api/coil/calculate').set(csrf).send(spec());
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toEqual(asJson(designCoil(spec())));
    // Sanity of the physics the route carries: R20 = ρ·ℓ/A with ρ = 1/58 Ω·mm²/m for annealed
    // copper at 20 °C (IEC 60028), within 1 % (the engine may round its wire table).
    const r = res.body;
    expect(Math.abs(r.resistance20 / (r.wireLength / (58e6 * r.wire.area)) - 1)).toBeLessThan(0.01);
  });

  it('POST /api/coil/sweep returns sweepWireSizes’ list unchanged', async () => {
    const res = await (await t.signIn('office')).post('/api/coil/sweep').set(csrf).send(spec());
    expect(res.status).toBe(200);
    expect(res.body).toEqual(asJson(sweepWireSizes(spec())));
    expect(res.body.length).toBeGreaterThan(3);
  });

  it('POST /api/coil/solve returns solveCoil’s result unchanged', async () => {
    const target = { ampereTurns: 500 };
    const res = await (await t.signIn('foreman')).post('/api/coil/solve').set(csrf).send({ spec: spec(), target });
    expect(res.status).toBe(200);
    expect(res.body).toEqual(asJson(solveCoil(spec(), target)));
  });

  it('an impossible spec → 400 validation naming the field', async () => {
    const inside = await engineer
      .post('/api/coil/calculate')
      .set(csrf)
      .send({ ...spec(), bobbin: { innerDiameter: 0.03, outerDiameter: 0.028, length: 0.032 } });
    expect(inside.status).toBe(400);
    expect(inside.body.error.code).toBe('validation');
    expect(inside.body.error.fields['bobbin.innerDiameter']).toMatch(/smaller than the outer/);
    const duty = await engineer.post('/api/coil/sweep').set(csrf).send({ ...spec(), dutyCycle: 1.5 });
    expect(duty.status).toBe(400);
    expect(duty.body.error.fields.dutyCycle).toBeTruthy();
    const pull = await engineer.post('/api/coil/solve').set(csrf).send({ spec: spec(), target: { pullForce: 20 } });
    expect(pull.status).toBe(400);
    expect(pull.body.error.fields['target.pullForce']).toMatch(/magnetic circuit/);
    const empty = await engineer.post('/api/coil/calculate').set(csrf).send({});
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).length).toBeGreaterThan(3);
  });

  it('a CoilSpecError from the engine becomes 400 with fields[error.field]', () => {
    // Past the contract (which would refuse it first): the engine's own check answers.
    const bad = { ...spec(), dutyCycle: 2 } as CoilSpec;
    try {
      calculate(bad);
      expect.unreachable();
    } catch (e) {
      expect(e).toMatchObject({ status: 400, code: 'validation', fields: { dutyCycle: expect.stringMatching(/duty cycle/) } });
    }
  });
});

describe('POST /api/coil/profile (the curves the build sheet draws)', () => {
  it('field along the axis peaks at the centre with the engine’s centre field, symmetric, falling outside', async () => {
    const res = await engineer.post('/api/coil/profile').set(csrf).send(spec());
    expect(res.status).toBe(200);
    const sheet = designCoil(spec());
    const field = res.body.field as { z: number; B: number }[];
    const centre = field.reduce((a, b) => (Math.abs(b.z) < Math.abs(a.z) ? b : a));
    expect(centre.z).toBeCloseTo(0, 12);
    expect(centre.B).toBeCloseTo(sheet.centreField, 9);
    expect(field[0].B).toBeCloseTo(field[field.length - 1].B, 9);
    expect(Math.max(...field.map((p) => p.B))).toBeCloseTo(centre.B, 9);
    expect(field[0].B).toBeLessThan(centre.B / 5);
    expect(res.body.pull).toBeNull();
  });

  it('warm-up rises from ambient towards the steady winding temperature, at 5 time constants within e⁻⁵ of it', async () => {
    const res = await engineer.post('/api/coil/profile').set(csrf).send(spec());
    const sheet = designCoil(spec());
    const warm = res.body.warmUp as { t: number; T: number }[];
    expect(warm[0]).toEqual({ t: 0, T: sheet.ambient });
    const last = warm[warm.length - 1];
    // A first-order system is within e⁻⁵ ≈ 0.7 % of its step at 5 τ (textbook result); a
    // voltage-driven winding gets there sooner (its power falls as it warms), never past it.
    expect(last.T).toBeGreaterThanOrEqual(sheet.ambient + sheet.temperatureRise * (1 - Math.exp(-5)) - 1e-9);
    expect(last.T).toBeLessThanOrEqual(sheet.windingTemperature + 1e-9);
    for (let i = 1; i < warm.length; i++) expect(warm[i].T).toBeGreaterThanOrEqual(warm[i - 1].T);
    expect(res.body.bh).toBeNull();
  });

  it('with a core the profile draws the iron’s B–H curve and the corners’ operating points', async () => {
    const curve: [number, number][] = [[100, 0.2], [200, 0.6], [300, 0.9], [500, 1.15], [1000, 1.35], [2000, 1.5]];
    const withCore = { ...spec(), magneticCircuit: { relativePermeability: 2000, saturationFluxDensity: 1.45, ironPathLength: 0.06, airGap: 0.001, gapCount: 1, area: 9.5e-5, bhCurve: curve } };
    const res = await engineer.post('/api/coil/profile').set(csrf).send(withCore);
    expect(res.status).toBe(200);
    const sheet = designCoil(withCore);
    expect(res.body.bh.model).toBe('curve');
    expect(res.body.bh.knee).toBe(1.45);
    const nominal = res.body.bh.points.find((p: { corner: string }) => p.corner === 'nominal');
    expect(nominal.B).toBeCloseTo(sheet.gapFluxDensity!, 9);
    // the picture runs past the operating points and through every stated point within its width
    const drawn = res.body.bh.curve as { H: number; B: number }[];
    const right = drawn[drawn.length - 1].H;
    expect(right).toBeGreaterThan(2 * Math.max(...res.body.bh.points.map((p: { H: number }) => p.H)));
    const within = curve.filter(([H]) => H <= right);
    expect(within.length).toBeGreaterThanOrEqual(3);
    for (const [H, B] of within) expect(drawn).toContainEqual({ H, B });
  });

  it('with a gapped core, pull falls as the gap opens and carries the lifting caution', async () => {
    const withCore = { ...spec(), magneticCircuit: { relativePermeability: 2000, saturationFluxDensity: 1.5, ironPathLength: 0.06, airGap: 0.002, gapCount: 1, area: 9.5e-5 } };
    const res = await engineer.post('/api/coil/profile').set(csrf).send(withCore);
    expect(res.status).toBe(200);
    const pts = res.body.pull.points as { gap: number; force: number }[];
    expect(pts[0].gap).toBe(0);
    for (let i = 2; i < pts.length; i++) expect(pts[i].force).toBeLessThanOrEqual(pts[i - 1].force);
    expect(res.body.pull.caution).toMatch(/lifting/i);
    const atDesign = pts.find((p) => Math.abs(p.gap - 0.002) < 1e-9)!;
    expect(atDesign.force).toBeCloseTo(designCoil(withCore).pullForce!, 6);
  });

  it('refuses an impossible spec with fields', async () => {
    const res = await engineer.post('/api/coil/profile').set(csrf).send({ ...spec(), dutyCycle: 2 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.dutyCycle).toBeTruthy();
  });
});

describe('GET /api/coil/reference (the engineer’s reference panel)', () => {
  it('serves the engine’s constants: IEC 60028 copper and the IEC 60085 classes', async () => {
    const res = await engineer.get('/api/coil/reference');
    expect(res.status).toBe(200);
    const cu = res.body.conductors.copper;
    expect(cu.resistivity20).toBeCloseTo(1e-6 / 58, 15); // IEC 60028: 1/58 Ω·mm²/m at 20 °C
    expect(cu.alpha20).toBeCloseTo(0.00393, 5); // IEC 60028 (three figures)
    expect(cu.density).toBe(8890); // IEC 60028: 8.89 g/cm³
    expect(cu.resistanceMethodK).toBeCloseTo(234.5, 9); // IEEE Std 118
    // 61 % IACS aluminium: k = 1/0.00403 − 20 (IEC 60121 α, from memory), not IEC 60034-1's 225
    expect(res.body.conductors.aluminium.resistanceMethodK).toBeCloseTo(228.139, 3);
    // IEC 60034-1 Table 7 hot-spot allowances (from memory): class − 40 °C − rise limit
    expect(res.body.hotSpot.allowances).toMatchObject({ 105: 5, 130: 10, 155: 10, 180: 15 });
    expect(res.body.coreMaterials.some((m: { bhCurve?: unknown }) => Array.isArray(m.bhCurve))).toBe(true);
    expect(res.body.thermalClasses).toEqual([105, 120, 130, 155, 180, 200, 220]); // IEC 60085
    expect(cu.sources.resistivity20).toMatch(/IEC 60028/);
  });
});
