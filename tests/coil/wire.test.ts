import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import {
  AWG_GAUGES,
  CONDUCTORS,
  CoilSpecError,
  METRIC_DIAMETERS,
  awgBareDiameter,
  awgFormulaDiameter,
  awgOverallDiameter,
  magnetWire,
  metricOverallDiameter,
} from '../../server/coil/index';

const inch = unit('1 inch').toNumber('m'); // mathjs unit conversion
const mil = unit('1 mil').toNumber('m');

describe('AWG bare diameters', () => {
  // ASTM B258 nominal diameters, inches, as printed (rounded to 0.0001 in) in the
  // "Copper Magnet Wire Data" table (NEMA MW 1000 data, scribd document 456864939) and
  // the AWG table at wp.1728.org (AWG 4). Looked up.
  const astm: [number, number][] = [
    [4, 0.2043],
    [6, 0.162],
    [10, 0.1019],
    [14, 0.0641],
    [18, 0.0403],
    [20, 0.032],
    [24, 0.0201],
    [28, 0.0126],
    [30, 0.01],
    [34, 0.0063],
    [36, 0.005],
    [40, 0.0031],
  ];
  it.each(astm)('AWG %i matches the ASTM B258 table within its rounding', (gauge, inches) => {
    const d = magnetWire({ standard: 'AWG', gauge }, 'copper', 2).bareDiameter;
    expect(Math.abs(d / inch - inches)).toBeLessThanOrEqual(0.00005 + 1e-9);
  });

  it('follows the ASTM B258 defining points: AWG 36 is 5 mil and AWG 0000 would be 460 mil', () => {
    // ASTM B258: the gauge is defined by 0.0050 in at No. 36 and 0.4600 in at No. 0000 (n = −3).
    expect(awgFormulaDiameter(36) / mil).toBeCloseTo(5, 10);
    expect(awgFormulaDiameter(-3) / mil).toBeCloseTo(460, 8);
  });

  it('stocks every AWG size 4–44', () => {
    expect(AWG_GAUGES).toEqual(Array.from({ length: 41 }, (_, i) => 4 + i));
  });
});

describe('IEC 60028 copper and conductor constants', () => {
  it('copper resistivity is 1/58 Ω·mm²/m, α 0.00393 /K, density 8.89 g/cm³', () => {
    // IEC 60028 annealed copper standard; converted with mathjs units.
    expect(CONDUCTORS.copper.resistivity20).toBeCloseTo(unit(1 / 58, 'ohm mm^2 / m').toNumber('ohm m'), 15);
    // IEC 60028 states 0.00393 /K (three figures); the engine carries 1/254.5 = 0.0039293.
    expect(CONDUCTORS.copper.alpha20).toBeCloseTo(0.00393, 5);
    expect(CONDUCTORS.copper.density).toBeCloseTo(unit('8.89 g/cm^3').toNumber('kg/m^3'), 9);
  });

  it('aluminium at 61 % IACS has 1/0.61 of the copper resistivity', () => {
    // 61 % IACS: conductivity relative to the IEC 60028 copper standard.
    expect(CONDUCTORS.aluminium.resistivity20 * 0.61).toBeCloseTo(1e-6 / 58, 15);
    expect(CONDUCTORS.aluminium.alpha20).toBe(0.00403); // issue 3 / from memory
    expect(CONDUCTORS.aluminium.density).toBeCloseTo(unit('2.70 g/cm^3').toNumber('kg/m^3'), 9);
  });

  it("copper's α is the line of IEEE Std 118's 234.5, and k is derived from α for both conductors", () => {
    // IEEE Std 118: R ∝ (234.5 + T) for copper, so α20 = 1/(234.5 + 20) (IEC 60034-1 rounds k to 235).
    expect(CONDUCTORS.copper.alpha20).toBeCloseTo(1 / (234.5 + 20), 12);
    expect(CONDUCTORS.copper.resistanceMethodK).toBeCloseTo(234.5, 9);
    // 61 % IACS aluminium, α20 = 0.00403 (IEC 60121, from memory): k = 1/0.00403 − 20 = 228.1390…
    expect(CONDUCTORS.aluminium.resistanceMethodK).toBeCloseTo(228.139, 3);
  });
});

describe('resistance and mass per length against handbook tables', () => {
  const perKft = unit('1000 ft').toNumber('m');
  // Nominal Ω per 1000 ft at 20 °C, "Copper Magnet Wire Data" table (NEMA MW 1000 data,
  // scribd document 456864939). Looked up. The table is computed from diameters rounded to
  // 0.1 mil, hence the 0.5 % tolerance.
  const ohmsPerKft: [number, number][] = [
    [10, 0.9988],
    [14, 2.524],
    [18, 6.386],
    [20, 10.13],
    [24, 25.67],
    [30, 103.7],
    [34, 261.3],
    [36, 414.8],
  ];
  it.each(ohmsPerKft)('AWG %i has the handbook resistance per length', (gauge, ohms) => {
    const w = magnetWire({ standard: 'AWG', gauge }, 'copper', 1);
    const ohmsPerKm = w.resistancePerMetre20 * 1000;
    const handbookPerKm = (ohms / perKft) * 1000;
    expect(Math.abs(ohmsPerKm / handbookPerKm - 1)).toBeLessThan(0.005);
  });

  // Bare copper weight, lb per 1000 ft: Centelsa "Round magnet wires" catalogue, NEMA MW 1000
  // table (issuu.com/centelsa/docs/magnet-wire). Looked up.
  const lbPerKft: [number, number][] = [
    [10, 31.43],
    [20, 3.101],
    [30, 0.3027],
    [40, 0.02928],
  ];
  it.each(lbPerKft)('AWG %i has the handbook copper weight', (gauge, lb) => {
    const w = magnetWire({ standard: 'AWG', gauge }, 'copper', 1);
    const kgPerM = unit(lb, 'lb').toNumber('kg') / perKft;
    // the table rounds diameters to 0.1 mil: allow 2 × 0.05 mil / d of area error plus 0.5 %
    const tolerance = (2 * 0.05) / (w.bareDiameter / mil) + 0.005;
    expect(Math.abs(w.conductorMassPerMetre / kgPerM - 1)).toBeLessThan(tolerance);
  });

  it('area, resistance and mass follow A = πd²/4, R = ρ/A, m = density·A plus the enamel annulus', () => {
    const w = magnetWire({ standard: 'metric', diameter: 0.5e-3 }, 'aluminium', 2);
    const area = (Math.PI / 4) * 0.5e-3 * 0.5e-3;
    expect(w.area).toBeCloseTo(area, 18);
    expect(w.resistancePerMetre20).toBeCloseTo(1e-6 / 58 / 0.61 / area, 9);
    expect(w.conductorMassPerMetre).toBeCloseTo(2700 * area, 12);
    // Grade 2 over 0.500 mm: 0.566 mm maximum (IEC 60317-0-1, from memory). Enamel 1.4 g/cm³
    // (polyesterimide / polyamide-imide, from memory): 1400 × π/4 × (0.566² − 0.500²) mm² =
    // 1400 × 0.7853982 × 0.070356e-6 m² = 7.7360e-5 kg/m, on 5.3014e-4 kg/m of aluminium.
    expect(w.massPerMetre - w.conductorMassPerMetre).toBeCloseTo(7.736e-5, 8);
  });

  it('the enamel adds 2–7 % to fine copper wire: AWG 30 heavy and 0.315 mm grade 2 by hand', () => {
    // AWG 30: bare 10.0 mil (ASTM B258), heavy build overall 11.9 mil maximum (our grade 2 row).
    // Enamel / copper = 1.4/8.89 × (11.9² − 10.0²)/10.0² = 0.15748 × 0.4161 = 6.553 %.
    const awg30 = magnetWire({ standard: 'AWG', gauge: 30 }, 'copper', 2);
    expect(awg30.massPerMetre / awg30.conductorMassPerMetre - 1).toBeCloseTo(0.06553, 4);
    // 0.315 mm grade 2: 0.367 mm maximum overall (IS 13730-0-1 table for SWG 30, looked up):
    // 1.4/8.89 × (0.367² − 0.315²)/0.315² = 0.15748 × 0.35743 = 5.629 %.
    const m315 = magnetWire({ standard: 'metric', diameter: 0.315e-3 }, 'copper', 2);
    expect(m315.massPerMetre / m315.conductorMassPerMetre - 1).toBeCloseTo(0.05629, 4);
  });
});

describe('overall diameters by grade', () => {
  // Single-film maximum overall diameter, mils, AWG 14–40: Centelsa catalogue table of
  // NEMA MW 1000 dimensions (issuu.com/centelsa/docs/magnet-wire). Looked up.
  const singleMax = [
    66.6, 59.4, 53.1, 47.5, 42.4, 37.9, 33.9, 30.3, 27.0, 24.3, 21.7, 19.4, 17.3, 15.6, 14.0, 12.6, 11.2, 10.0,
    9.1, 8.1, 7.2, 6.4, 5.8, 5.2, 4.7, 4.1, 3.7,
  ];
  it('grade 1 (single build) AWG 14–40 matches the NEMA MW 1000 table', () => {
    singleMax.forEach((m, i) => expect(awgOverallDiameter(14 + i, 1) / mil).toBeCloseTo(m, 6));
  });

  it('grade 2 (heavy build) AWG 6–9 matches the NEMA MW 1000 table', () => {
    // Same Centelsa table, heavy-film maximum diameters, mils. Looked up.
    [167.1, 149.1, 133.2, 118.9].forEach((m, i) => expect(awgOverallDiameter(6 + i, 2) / mil).toBeCloseTo(m, 6));
  });

  it('grade 2 leaves room for the NEMA MW 1000 heavy minimum increment over the bare wire', () => {
    // Heavy-film minimum increment, mils, AWG 6–40, same Centelsa table. Looked up.
    const heavyMinIncrement = [
      3.5, 3.4, 3.3, 3.2, 3.1, 3.0, 2.9, 2.8, 3.2, 3.0, 2.9, 2.8, 2.6, 2.5, 2.3, 2.2, 2.1, 2.0, 1.9, 1.8, 1.7, 1.6,
      1.6, 1.5, 1.4, 1.3, 1.2, 1.1, 1.0, 0.9, 0.8, 0.8, 0.7, 0.6, 0.6,
    ];
    heavyMinIncrement.forEach((inc, i) => {
      const g = 6 + i;
      const overall = awgOverallDiameter(g, 2) / mil;
      const bare = awgBareDiameter(g) / mil;
      expect(overall).toBeGreaterThanOrEqual(bare + inc - 0.05);
      // and a maximum is never more than the increment plus a few mils of tolerance
      expect(overall).toBeLessThan(bare + inc + 2);
    });
  });

  it('a heavier grade is always thicker, and a thinner gauge always thinner, AWG and metric', () => {
    for (const g of AWG_GAUGES) {
      const [d1, d2, d3] = [1, 2, 3].map((grade) => awgOverallDiameter(g, grade as 1 | 2 | 3));
      expect(awgBareDiameter(g)).toBeLessThan(d1);
      expect(d1).toBeLessThan(d2);
      expect(d2).toBeLessThan(d3);
      if (g > 4) expect(d2).toBeLessThan(awgOverallDiameter(g - 1, 2));
    }
    for (let i = 0; i < METRIC_DIAMETERS.length; i++) {
      const d = METRIC_DIAMETERS[i];
      const [d1, d2, d3] = [1, 2, 3].map((grade) => metricOverallDiameter(d, grade as 1 | 2 | 3));
      expect(d).toBeLessThan(d1);
      expect(d1).toBeLessThan(d2);
      expect(d2).toBeLessThan(d3);
      if (i > 0) expect(d1).toBeLessThan(metricOverallDiameter(METRIC_DIAMETERS[i - 1], 1));
    }
  });

  it('metric grade 1 at 0.100 mm is 0.117 mm maximum', () => {
    // Elektrisola grade table as quoted at enameled-wires.com/Technical-Documentation/341.html
    // ("a 0.100 G1 wire … 0.108 mm to 0.117 mm"). Looked up.
    expect(metricOverallDiameter(0.1e-3, 1)).toBeCloseTo(0.117e-3, 12);
  });

  it('metric maxima at 0.500 and 1.000 mm', () => {
    // IEC 60317-0-1 Table 1 maximum overall diameters (from memory).
    expect(metricOverallDiameter(0.5e-3, 1)).toBeCloseTo(0.544e-3, 12);
    expect(metricOverallDiameter(0.5e-3, 2)).toBeCloseTo(0.566e-3, 12);
    expect(metricOverallDiameter(1e-3, 1)).toBeCloseTo(1.062e-3, 12);
    expect(metricOverallDiameter(1e-3, 2)).toBeCloseTo(1.093e-3, 12);
  });

  it('covers the IEC 60317-0-1 range 0.018–5.000 mm (from memory)', () => {
    expect(Math.min(...METRIC_DIAMETERS)).toBeCloseTo(0.018e-3, 12);
    expect(Math.max(...METRIC_DIAMETERS)).toBeCloseTo(5e-3, 12);
  });
});

describe('magnetWire refuses unknown sizes', () => {
  it.each([
    [{ standard: 'AWG', gauge: 45 }, 'wire.gauge'],
    [{ standard: 'AWG', gauge: 3 }, 'wire.gauge'],
    [{ standard: 'AWG', gauge: 20.5 }, 'wire.gauge'],
    [{ standard: 'metric', diameter: 0.31e-3 }, 'wire.diameter'],
    [{ standard: 'metric', diameter: -0.5e-3 }, 'wire.diameter'],
  ])('%o → %s', (size, field) => {
    try {
      magnetWire(size as never, 'copper', 2);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CoilSpecError);
      expect((e as CoilSpecError).field).toBe(field);
    }
  });
});
