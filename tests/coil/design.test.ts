import { describe, expect, it } from 'vitest';
import {
  AWG_GAUGES,
  CoilSpecError,
  ENGINE_VERSION,
  awgOverallDiameter,
  designCoil,
  solveCoil,
  sweepWireSizes,
} from '../../server/coil/index';
import type { CoilSpec } from '../../server/coil/index';
import { baseSpec, magnetSpec } from './fixtures';

// baseSpec: bobbin Dᵢ 10 mm, D 20 mm, traverse 20 mm; wire 0.45 mm bare, 0.5 mm overall.
const d = 0.5e-3;
const bare = 0.45e-3;
const area = (Math.PI / 4) * bare * bare;
const rho = 1e-6 / 58; // IEC 60028

describe('winding geometry (the methods stated in issue 3)', () => {
  it('layer: ⌊ℓ/d⌋ per layer, ⌊(D − Dᵢ)/2d⌋ layers, built Dᵢ + 2·layers·d', () => {
    const s = designCoil(baseSpec({ leadLength: 0.2 }));
    expect(s.turnsPerLayer).toBe(40);
    expect(s.layers).toBe(10);
    expect(s.turns).toBe(400);
    expect(s.outerDiameter).toBeCloseTo(0.02, 12);
    const mtl = (Math.PI * (0.01 + 0.02)) / 2;
    expect(s.meanTurnLength).toBeCloseTo(mtl, 12);
    expect(s.wireLength).toBeCloseTo(400 * mtl + 0.2, 9);
    expect(s.resistance20).toBeCloseTo((rho * (400 * mtl + 0.2)) / area, 9);
    expect(s.conductorMass).toBeCloseTo(8890 * area * (400 * mtl + 0.2), 9);
    // insulated: plus the enamel annulus up to the 0.5 mm spool diameter at 1.4 g/cm³ (from memory)
    expect(s.wireMass).toBeCloseTo((8890 * area + 1400 * (Math.PI / 4) * (d * d - bare * bare)) * (400 * mtl + 0.2), 9);
    expect(s.fillFactor).toBeCloseTo((400 * area) / (0.02 * 0.005), 12);
    expect(s.surfaceArea).toBeCloseTo(Math.PI * 0.02 * 0.02 + 2 * (Math.PI / 4) * (0.02 ** 2 - 0.01 ** 2), 12);
    expect(s.warnings.map((w) => w.code)).not.toContain('does-not-fit');
  });

  it('orthocyclic: radial pitch √3/2·d after the first layer, alternate layers one turn fewer', () => {
    const s = designCoil(baseSpec({ pattern: 'orthocyclic' }));
    const pitch = (Math.sqrt(3) / 2) * d;
    const layers = Math.floor((0.005 - d) / pitch) + 1; // 11
    expect(s.layers).toBe(layers);
    expect(s.turns).toBe(Math.ceil(layers / 2) * 40 + Math.floor(layers / 2) * 39);
    expect(s.outerDiameter).toBeCloseTo(0.01 + 2 * (d + (layers - 1) * pitch), 12);
    expect(s.outerDiameter).toBeLessThanOrEqual(0.02);
  });

  it('random, older sheets: a bare fill factor is read as turns = fill × window / bare area', () => {
    const s = designCoil(baseSpec({ pattern: 'random', fillFactor: 0.45 }));
    expect(s.turns).toBe(Math.floor((0.45 * 0.02 * 0.005) / area));
    expect(s.fillFactor).toBeCloseTo(0.45, 2);
    expect(s.outerDiameter).toBeLessThanOrEqual(0.02 + 1e-12);
  });

  it('fixed turns: layers and built diameter follow', () => {
    const s = designCoil(baseSpec({ turns: 130 }));
    expect(s.turns).toBe(130);
    expect(s.layers).toBe(Math.ceil(130 / 40));
    expect(s.outerDiameter).toBeCloseTo(0.01 + 2 * 4 * d, 12);
    expect(s.warnings.map((w) => w.code)).not.toContain('does-not-fit');
  });

  it('fixed turns that exceed the bobbin are reported as does-not-fit', () => {
    const s = designCoil(baseSpec({ turns: 1000 }));
    expect(s.outerDiameter).toBeGreaterThan(0.02);
    const w = s.warnings.find((x) => x.code === 'does-not-fit');
    expect(w?.message).toMatch(/bobbin allows 20\.00 mm/);
  });

  it('a wire thicker than the traverse does not wind', () => {
    const s = designCoil(baseSpec({ bobbin: { innerDiameter: 0.01, outerDiameter: 0.02, length: 0.0004 } }));
    expect(s.turns).toBe(0);
    expect(s.warnings.map((w) => w.code)).toEqual(['does-not-fit']);
  });
});

describe('current density', () => {
  it('warns above 4 A/mm² continuous (common practice), scaled by 1/√duty', () => {
    const amps = 0.9; // 0.9 A / 0.159 mm² ≈ 5.7 A/mm²
    const j = amps / area;
    expect(j).toBeGreaterThan(4e6);
    const cont = designCoil(baseSpec({ drive: { kind: 'current', amps }, heatTransferCoefficient: 100 }));
    expect(cont.currentDensity).toBeCloseTo(j, 3);
    expect(cont.warnings.map((w) => w.code)).toContain('current-density');
    // at 40 % duty the limit is 4/√0.4 ≈ 6.3 A/mm²
    const pulsed = designCoil(baseSpec({ drive: { kind: 'current', amps }, dutyCycle: 0.4, heatTransferCoefficient: 100 }));
    expect(pulsed.warnings.map((w) => w.code)).not.toContain('current-density');
  });
});

describe('build sheet contents', () => {
  it('exports a version string and lists its constants with sources', () => {
    expect(typeof ENGINE_VERSION).toBe('string');
    expect(ENGINE_VERSION).toMatch(/^\d+\.\d+\.\d+$/);
    const s = designCoil(baseSpec());
    const names = s.assumptions.map((a) => a.name);
    expect(names).toContain('copper resistivity at 20 °C');
    expect(names).toContain('magnetic constant μ0');
    expect(s.assumptions.find((a) => a.name === 'copper resistivity at 20 °C')?.source).toMatch(/IEC 60028/);
    expect(s.assumptions.find((a) => a.name === 'heat-transfer coefficient h')?.source).toMatch(/common practice/);
    for (const a of s.assumptions) expect(a.source.length).toBeGreaterThan(5);
  });

  it('the spool overall diameter overrides the table', () => {
    const table = designCoil(baseSpec({ overallDiameter: undefined }));
    expect(table.wire.overallDiameter).toBeCloseTo(0.512e-3, 12); // our grade 2 table row for 0.450 mm
    expect(designCoil(baseSpec()).wire.overallDiameter).toBe(0.5e-3);
  });
});

describe('sweepWireSizes', () => {
  it('returns only AWG sizes that wind at least one turn in one layer', () => {
    const spec = magnetSpec({ wire: { standard: 'AWG', gauge: 30 }, bobbin: { innerDiameter: 0.01, outerDiameter: 0.016, length: 0.004 } });
    const sheets = sweepWireSizes(spec);
    const gauges = sheets.map((s) => (s.wire.size.standard === 'AWG' ? s.wire.size.gauge : -1));
    for (const g of AWG_GAUGES) {
      const od = awgOverallDiameter(g, 2);
      const winds = Math.floor(0.004 / od + 1e-9) >= 1 && Math.floor(0.003 / od + 1e-9) >= 1;
      expect(gauges.includes(g)).toBe(winds);
    }
    for (const s of sheets) {
      expect(s.turnsPerLayer).toBeGreaterThanOrEqual(1);
      expect(s.layers).toBeGreaterThanOrEqual(1);
    }
  });

  it('sweeps the metric series when the spec is metric', () => {
    const sheets = sweepWireSizes(baseSpec());
    expect(sheets.length).toBeGreaterThan(20);
    expect(sheets.every((s) => s.wire.size.standard === 'metric')).toBe(true);
  });
});

describe('solveCoil', () => {
  const spec = magnetSpec({ dutyCycle: 0.5 });
  const target = { pullForce: 15 };
  const result = solveCoil(spec, target);

  it('keeps sizes that meet the target at the low corner and within the class at the high corner, ranked by hot power then copper', () => {
    expect(result.candidates.length).toBeGreaterThan(0);
    expect(result.best).toBe(result.candidates[0]);
    for (const c of result.candidates) {
      expect(c.corners.low.pullForce!).toBeGreaterThanOrEqual(15);
      expect(c.pullForce!).toBeGreaterThanOrEqual(c.corners.low.pullForce!);
      expect(c.warnings.map((w) => w.code)).not.toContain('over-temperature');
      expect(c.warnings.map((w) => w.code)).not.toContain('does-not-fit');
      expect(c.thermalRunaway).toBe(false);
      // class 155: 10 K hot-spot allowance (IEC 60034-1 Table 7, from memory)
      expect(c.corners.high.windingTemperature + 10).toBeLessThanOrEqual(155);
    }
    for (let i = 1; i < result.candidates.length; i++) {
      expect(result.candidates[i].powerHot).toBeGreaterThanOrEqual(result.candidates[i - 1].powerHot);
    }
  });

  it('says in words why every other size fails', () => {
    expect(result.candidates.length + result.rejected.length).toBe(41);
    for (const r of result.rejected) {
      expect(r.reasons.length).toBeGreaterThan(0);
      for (const reason of r.reasons) expect(reason).toMatch(/[a-z]{3,} [a-z]{2,}/);
    }
    expect(result.rejected.some((r) => r.reasons.some((x) => /short of the 15\.0 N needed/.test(x)))).toBe(true);
    expect(result.rejected.some((r) => r.reasons.some((x) => /fire risk/.test(x)))).toBe(true);
  });

  it('best is the lowest-power size among individually designed sizes that meet the target', () => {
    let bestPower = Infinity;
    for (const gauge of AWG_GAUGES) {
      const s = designCoil({ ...spec, wire: { standard: 'AWG', gauge } });
      const ok =
        s.turns > 0 &&
        (s.corners.low.pullForce ?? 0) >= 15 &&
        !s.warnings.some((w) => ['does-not-fit', 'over-temperature', 'thermal-runaway'].includes(w.code));
      if (ok) bestPower = Math.min(bestPower, s.powerHot);
    }
    expect(result.best!.powerHot).toBe(bestPower);
  });

  it('returns no best when nothing can meet the target', () => {
    const r = solveCoil(spec, { ampereTurns: 1e7 });
    expect(r.best).toBeNull();
    expect(r.candidates).toEqual([]);
  });

  it('refuses a pull target without a magnetic circuit', () => {
    expect(() => solveCoil(baseSpec(), { pullForce: 1 })).toThrow(CoilSpecError);
    expect(() => solveCoil(baseSpec(), {})).toThrow(CoilSpecError);
  });
});

describe('invalid specs throw a CoilSpecError naming the field', () => {
  const cases: [string, Partial<CoilSpec>, string][] = [
    ['negative inner diameter', { bobbin: { innerDiameter: -0.001, outerDiameter: 0.02, length: 0.02 } }, 'bobbin.innerDiameter'],
    ['negative length', { bobbin: { innerDiameter: 0.01, outerDiameter: 0.02, length: -0.02 } }, 'bobbin.length'],
    ['inner ≥ outer', { bobbin: { innerDiameter: 0.02, outerDiameter: 0.02, length: 0.02 } }, 'bobbin.innerDiameter'],
    ['duty 0', { dutyCycle: 0 }, 'dutyCycle'],
    ['duty above 1', { dutyCycle: 1.2 }, 'dutyCycle'],
    ['unknown AWG gauge', { wire: { standard: 'AWG', gauge: 50 }, overallDiameter: undefined }, 'wire.gauge'],
    ['unknown metric size', { wire: { standard: 'metric', diameter: 0.47e-3 } }, 'wire.diameter'],
    ['negative voltage', { drive: { kind: 'voltage', volts: -12 } }, 'drive.volts'],
    ['unknown class', { insulationClass: 150 as never }, 'insulationClass'],
    ['overall below bare', { overallDiameter: 0.4e-3 }, 'overallDiameter'],
    ['fill factor on a layer winding', { fillFactor: 0.5 }, 'fillFactor'],
    ['packing on a layer winding', { packingFactor: 0.9 }, 'packingFactor'],
    ['packing beyond close packing', { pattern: 'random', packingFactor: 1.2 }, 'packingFactor'],
    ['highest ambient below the rated one', { ambientMax: 20 }, 'ambientMax'],
    ['supply band above the rated value at its low end', { supplyTolerance: { low: 1.05, high: 1.1 } }, 'supplyTolerance.low'],
    ['supply band below the rated value at its high end', { supplyTolerance: { low: 0.85, high: 0.95 } }, 'supplyTolerance.high'],
    ['zero cycle time', { cycleTime: 0 }, 'cycleTime'],
    ['a TVS without its clamp voltage', { suppression: { kind: 'tvs' } }, 'suppression.clampVoltage'],
    ['a clamp voltage without suppression', { suppression: { kind: 'none', clampVoltage: 30 } }, 'suppression.clampVoltage'],
    ['fractional turns', { turns: 10.5 }, 'turns'],
  ];
  it.each(cases)('%s', (_label, over, field) => {
    let err: unknown;
    try {
      designCoil(baseSpec(over));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(CoilSpecError);
    expect((err as CoilSpecError).field).toBe(field);
    expect((err as CoilSpecError).message.length).toBeGreaterThan(field.length + 5);
  });
});
