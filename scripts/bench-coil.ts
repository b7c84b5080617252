/**
 * Coil engine timing: median time of designCoil and of a full AWG sweep (AWG 4–44) over many
 * runs, beside a trivial function timed the same way in the same run. Prints figures only.
 * Run: npx tsx scripts/bench-coil.ts
 */
import { designCoil, ENGINE_VERSION, sweepWireSizes } from '../server/coil/index';
import type { CoilSpec } from '../server/coil/index';

const spec: CoilSpec = {
  conductor: 'copper',
  wire: { standard: 'AWG', gauge: 26 },
  insulationGrade: 2,
  bobbin: { innerDiameter: 0.012, outerDiameter: 0.03, length: 0.03 },
  pattern: 'layer',
  leadLength: 0.3,
  drive: { kind: 'voltage', volts: 12 },
  dutyCycle: 0.5,
  ambient: 25,
  insulationClass: 155,
  magneticCircuit: {
    relativePermeability: 2000,
    saturationFluxDensity: 1.6,
    ironPathLength: 0.1,
    airGap: 0.001,
    gapCount: 1,
    area: 1e-4,
  },
};

let sink = 0;
function trivial(x: number): number {
  return x + 1;
}

/** Median time per call in microseconds: `runs` samples of `batch` calls each. */
function median(fn: () => void, runs: number, batch: number): number {
  for (let i = 0; i < batch * 20; i++) fn(); // warm-up
  const samples: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < batch; i++) fn();
    const t1 = process.hrtime.bigint();
    samples.push(Number(t1 - t0) / 1e3 / batch);
  }
  samples.sort((a, b) => a - b);
  return samples[Math.floor(samples.length / 2)];
}

const tTrivial = median(() => {
  sink += trivial(sink & 1);
}, 501, 1000);
const tDesign = median(() => {
  sink += designCoil(spec).turns;
}, 501, 50);
const tSweep = median(() => {
  sink += sweepWireSizes(spec).length;
}, 501, 5);

// The heaviest case: an on/off cycle integrated per size and the iron solved on a B–H curve.
const cycled: CoilSpec = {
  ...spec,
  cycleTime: 120,
  ambientMax: 40,
  magneticCircuit: {
    ...spec.magneticCircuit!,
    bhCurve: [[100, 0.2], [200, 0.6], [300, 0.9], [500, 1.15], [1000, 1.35], [2000, 1.5], [4000, 1.62], [8000, 1.72]],
  },
};
const tCycled = median(() => {
  sink += sweepWireSizes(cycled).length;
}, 501, 5);

const fmt = (us: number) => `${us.toFixed(3).padStart(10)} µs`;
console.log(`coil engine ${ENGINE_VERSION} — median over 501 runs (node ${process.version})`);
console.log(`trivial function     ${fmt(tTrivial)}`);
console.log(`designCoil           ${fmt(tDesign)}`);
console.log(`AWG sweep (4–44)     ${fmt(tSweep)}   target < 1000 µs`);
console.log(`  with cycle + B–H   ${fmt(tCycled)}   target < 1000 µs`);
if (sink === -1) console.log('');
