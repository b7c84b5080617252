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
