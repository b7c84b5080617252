/**
 * The second edition's wire tables: ASTM B258 tabulated AWG diameters, the R40 metric sizes of
 * IEC 60317-0-1, the wire standards' resistance tolerances, and the insulated wire's mass.
 */
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { AWG_NOMINAL_DIAMETERS_IN, METRIC_NOMINAL_DIAMETERS_MM } from '../../src/contracts/coil';
import { METRIC_DIAMETERS, awgBareDiameter, awgFormulaDiameter, magnetWire, metricOverallDiameter } from '../../server/coil/index';

const inch = unit('1 inch').toNumber('m'); // mathjs unit conversion
const mil = inch / 1000;

describe('AWG 30–44 bare diameters are the ASTM B258 tabulated (rounded) values', () => {
  // ASTM B258, Table 1 "Standard nominal diameters", inches, typed from the table as reprinted
  // in NEMA MW 1000 wire makers' data (e.g. the "Copper Magnet Wire Data" table, scribd document
  // 456864939, for AWG 30–36; AWG 37–44 from the same standard's table, from memory).
  const table: [number, number][] = [
    [30, 0.01],
    [31, 0.0089],
    [32, 0.008],
    [33, 0.0071],
    [34, 0.0063],
    [35, 0.0056],
    [36, 0.005],
    [37, 0.0045],
    [38, 0.004],
    [39, 0.0035],
    [40, 0.0031],
    [41, 0.0028],
    [42, 0.0025],
    [43, 0.0022],
    [44, 0.002],
  ];
  it.each(table)('AWG %i is %f in', (gauge, inches) => {
    expect(awgBareDiameter(gauge) / inch).toBeCloseTo(inches, 9);
    expect(magnetWire({ standard: 'AWG', gauge }, 'copper', 2).bareDiameter / inch).toBeCloseTo(inches, 9);
  });

  it('the table is the defining formula rounded to 0.1 mil (the ASTM B258 rounding rule, from memory)', () => {
    for (let gauge = 4; gauge <= 44; gauge++) {
      expect(awgBareDiameter(gauge) / mil).toBeCloseTo(Math.round((awgFormulaDiameter(gauge) / mil) * 10) / 10, 9);
    }
  });

  it('AWG 40 has the 1079 Ω per 1000 ft of the tables, not the unrounded 1049', () => {
    // NEMA MW 1000 nominal resistance of AWG 40 at 20 °C: 1079 Ω/1000 ft (from memory). By hand:
    // ρ/A = (1/58 Ω·mm²/m) / (π/4 × (0.0031 × 25.4 mm)²) = 3.5407 Ω/m = 1079.2 Ω/1000 ft.
    const w = magnetWire({ standard: 'AWG', gauge: 40 }, 'copper', 2);
    const perKft = w.resistancePerMetre20 * unit('1000 ft').toNumber('m');
    expect(perKft).toBeCloseTo(1079.2, 1);
    expect(Math.abs(perKft / 1079 - 1)).toBeLessThan(0.001);
  });

  it('the contract carries the same table', () => {
    AWG_NOMINAL_DIAMETERS_IN.forEach((inches, i) => expect(awgBareDiameter(4 + i) / inch).toBeCloseTo(inches, 9));
  });
});

describe('IEC 60317-0-1 metric sizes with the R40 series', () => {
  it('a shop can enter the R40 sizes: 0.30, 0.60, 0.75, 0.85, 0.95, 1.06, 1.18, 1.50 mm', () => {
    // IEC 60317-0-1 nominal diameters of the R40 series (ISO 3 preferred numbers, from memory).
    for (const mm of [0.3, 0.6, 0.75, 0.85, 0.95, 1.06, 1.18, 1.5]) {
      expect(METRIC_DIAMETERS.some((d) => Math.abs(d - mm * 1e-3) < 1e-12)).toBe(true);
      expect(() => magnetWire({ standard: 'metric', diameter: mm * 1e-3 }, 'copper', 2)).not.toThrow();
    }
    expect((METRIC_NOMINAL_DIAMETERS_MM as readonly number[]).includes(0.3)).toBe(true);
    // 0.020 to 5.000 mm, R20 and R40: 49 + 49 sizes, with 0.018 mm kept from the first edition.
    expect(Math.min(...METRIC_DIAMETERS)).toBeCloseTo(0.018e-3, 12);
    expect(Math.max(...METRIC_DIAMETERS)).toBeCloseTo(5e-3, 12);
  });

  // Nominal resistance at 20 °C = IEC 60028 resistivity 1/58 Ω·mm²/m over π/4·d², worked by hand:
  const ohmsPerMetre: [number, number][] = [
    [0.3, 0.243916], // 0.0706858 mm² (R40)
    [0.6, 0.0609789], // 0.282743 mm² (R40)
    [0.75, 0.0390265], // 0.441786 mm² (R40)
    [1.06, 0.0195376], // 0.882473 mm² (R40)
    [0.315, 0.221239], // 0.0779311 mm² (R20)
    [0.5, 0.0878096], // 0.196350 mm² (R20)
  ];
  it.each(ohmsPerMetre)('%f mm copper: %f Ω/m at 20 °C', (mm, ohms) => {
    const w = magnetWire({ standard: 'metric', diameter: mm * 1e-3 }, 'copper', 2);
    expect(Math.abs(w.resistancePerMetre20 / ohms - 1)).toBeLessThan(2e-5);
  });

  it('R40 rows sit between their R20 neighbours, grade by grade', () => {
    const pairs: [number, number, number][] = [
      [0.28, 0.3, 0.315],
      [0.56, 0.6, 0.63],
      [0.71, 0.75, 0.8],
      [1.0, 1.06, 1.12],
    ];
    for (const [lo, mid, hi] of pairs) {
      for (const g of [1, 2, 3] as const) {
        const od = metricOverallDiameter(mid * 1e-3, g);
        expect(od).toBeGreaterThan(metricOverallDiameter(lo * 1e-3, g));
        expect(od).toBeLessThan(metricOverallDiameter(hi * 1e-3, g));
      }
    }
  });

  it('0.315 mm has the published grade 1/2/3 maxima and leaves the published minimum build', () => {
    // IS 13730-0-1 (the Indian adoption of IEC 60317-0-1), as tabulated by Avanti Cables for
    // SWG 30 = 0.315 mm: minimum increase 0.019 / 0.035 / 0.053 mm, maximum overall 0.349 /
    // 0.367 / 0.384 mm for grades 1 / 2 / 3. Looked up.
    const max = [0.349, 0.367, 0.384];
    const minIncrease = [0.019, 0.035, 0.053];
    ([1, 2, 3] as const).forEach((g, i) => {
      const od = metricOverallDiameter(0.315e-3, g);
      expect(od).toBeCloseTo(max[i] * 1e-3, 12);
      expect(od - 0.315e-3).toBeGreaterThanOrEqual(minIncrease[i] * 1e-3);
    });
  });
});

describe('resistance tolerance of the wire standards', () => {
  it('AWG 30 and 36: the NEMA MW 1000 resistance limits', () => {
    // "Copper Magnet Wire Data" (NEMA MW 1000 data, scribd document 456864939), Ω/1000 ft at 20 °C,
    // min / nom / max: AWG 30 101.7 / 103.7 / 105.8; AWG 36 398.7 / 414.8 / —. Looked up.
    const w30 = magnetWire({ standard: 'AWG', gauge: 30 }, 'copper', 2).resistanceTolerance;
    expect(w30.plus).toBeCloseTo(105.8 / 103.7 - 1, 3);
    expect(w30.minus).toBeCloseTo(1 - 101.7 / 103.7, 3);
    const w36 = magnetWire({ standard: 'AWG', gauge: 36 }, 'copper', 2).resistanceTolerance;
    expect(w36.minus).toBeCloseTo(1 - 398.7 / 414.8, 3);
  });

  it('metric: from the IEC 60317-0-1 conductor tolerance, R ∝ 1/d²', () => {
    // Transwire "tolerance on nominal diameter of conductor" (IEC 60317-0-1 values): 0.315 mm
    // ±0.004 mm, so the R40 size 0.300 mm takes ±0.004 mm too; 1.120 mm ±0.011 mm, so 1.060 mm
    // takes ±0.011 mm. Looked up. By hand: (0.300/0.296)² − 1 = +2.721 %, 1 − (0.300/0.304)² =
    // −2.614 %; (1.060/1.049)² − 1 = +2.108 %, 1 − (1.060/1.071)² = −2.044 %.
    const t300 = magnetWire({ standard: 'metric', diameter: 0.3e-3 }, 'copper', 2).resistanceTolerance;
    expect(t300.plus).toBeCloseTo(0.02721, 4);
    expect(t300.minus).toBeCloseTo(0.02614, 4);
    const t106 = magnetWire({ standard: 'metric', diameter: 1.06e-3 }, 'copper', 2).resistanceTolerance;
    expect(t106.plus).toBeCloseTo(0.02108, 4);
    expect(t106.minus).toBeCloseTo(0.02044, 4);
  });

  it('0.020 mm wire: about ±10 %, as a fine-wire maker publishes', () => {
    // Elektrisola's 0.020 mm strand: 55.50 Ω/m nominal, 49.95 min, 61.05 max = ±10 %. Looked up.
    const t = magnetWire({ standard: 'metric', diameter: 0.02e-3 }, 'copper', 1).resistanceTolerance;
    expect(t.minus).toBeGreaterThan(0.08);
    expect(t.minus).toBeLessThan(0.12);
    expect(t.plus).toBeGreaterThan(0.08);
    expect(t.plus).toBeLessThan(0.12);
  });
});
