/**
 * Judging one unit's test against its build sheet: pure, no database. The engine does the physics
 * (correctResistance, temperatureRiseByResistance); this file applies the limits, reading by
 * reading, and says why a reading failed. Limits come from TEST_DEFAULTS (src/contracts/test-records.ts,
 * each marked with its source) and the line's tolerance.
 */
import { TEST_DEFAULTS, type Reading, type RecordTestRequest } from '../../src/contracts/test-records';
import { correctResistance, DEFAULT_HEAT_TRANSFER_COEFFICIENT, temperatureRiseByResistance, type BuildSheet, type CoilSpec } from '../coil';

/**
 * Slack on the tolerance comparison: within ± tolerance INCLUSIVE passes; floating-point noise of
 * the correction (≈1e-15 relative) must not turn an exact edge into a failure.
 */
const EDGE_EPSILON = 1e-9;

export type Judgement = {
  resistance20: number;
  nominalResistance20: number;
  tolerancePercent: number;
  deviationPercent: number;
  deviationOhms: number;
  readings: Reading[];
  passed: boolean;
  reasons: string[];
};

const fmt = (x: number, digits = 4) => Number(x.toPrecision(digits)).toString();
const pct = (x: number) => `${x >= 0 ? '+' : ''}${x.toFixed(2)} %`;

/** The hi-pot test voltage: 1000 V + 2 × rated voltage (common practice from memory of machine standards). */
export function hipotTestVoltage(spec: CoilSpec, result: BuildSheet): number {
  const rated = spec.drive.kind === 'voltage' ? spec.drive.volts : result.voltage;
  return TEST_DEFAULTS.hipotBaseVolts + TEST_DEFAULTS.hipotRatedMultiplier * rated;
}

/** The coefficient the engine used for this design, W/(m²·K). */
export const heatTransferUsed = (spec: CoilSpec) => spec.heatTransferCoefficient ?? DEFAULT_HEAT_TRANSFER_COEFFICIENT;

/**
 * Effective heat-transfer coefficient from a heat run. At fixed dissipated power ΔT ∝ 1/h
 * (Newton's law of cooling, P = h·A·ΔT), so h_eff = h_used × ΔT_predicted / ΔT_measured.
 * An approximation: it ignores that the coil's power changes with its hot resistance.
 */
export function effectiveHeatTransfer(hUsed: number, predictedRise: number, measuredRise: number): number | null {
  if (!(measuredRise > 0) || !(predictedRise > 0)) return null;
  return (hUsed * predictedRise) / measuredRise;
}

export function judgeUnit(input: RecordTestRequest, sheet: { spec: CoilSpec; result: BuildSheet }, tolerancePercent: number): Judgement {
  const { spec, result } = sheet;
  const readings: Reading[] = [];
  const conductor = spec.conductor;

  // DC resistance corrected to 20 °C (IEC 60034-1 / IEEE Std 118: R20 = R·(k+20)/(k+θ), k = 234.5 Cu, 225 Al).
  const nominal = result.resistance20;
  const r20 = correctResistance(input.resistance, input.temperature, 20, conductor);
  const deviationOhms = r20 - nominal;
  const deviationPercent = (deviationOhms / nominal) * 100;
  const rOk = Math.abs(deviationPercent) <= tolerancePercent + EDGE_EPSILON;
  readings.push({
    name: 'resistance',
    value: r20,
    limit: { min: nominal * (1 - tolerancePercent / 100), max: nominal * (1 + tolerancePercent / 100), text: `R20 ${fmt(nominal)} Ω ± ${tolerancePercent} %` },
    passed: rOk,
    reason: rOk ? '' : `Resistance at 20 °C ${fmt(r20)} Ω is ${pct(deviationPercent)} (${deviationOhms >= 0 ? '+' : ''}${fmt(deviationOhms)} Ω) from ${fmt(nominal)} Ω, outside ± ${tolerancePercent} %`,
    derived: { measured: input.resistance, measuredAt: input.temperature, deviationPercent, deviationOhms },
  });

  if (input.hipot) {
    const h = input.hipot;
    const required = hipotTestVoltage(spec, result);
    const why: string[] = [];
    if (h.breakdown) why.push('insulation broke down');
    if (h.voltage < required) why.push(`applied ${fmt(h.voltage)} V, below the test voltage ${fmt(required)} V`);
    if (h.seconds < TEST_DEFAULTS.hipotSeconds) why.push(`held ${fmt(h.seconds)} s, less than ${TEST_DEFAULTS.hipotSeconds} s`);
    if (h.leakage > TEST_DEFAULTS.hipotLeakageMax) why.push(`leakage ${fmt(h.leakage * 1000)} mA over ${fmt(TEST_DEFAULTS.hipotLeakageMax * 1000)} mA`);
    readings.push({
      name: 'hipot',
      value: h.leakage,
      limit: { max: TEST_DEFAULTS.hipotLeakageMax, text: `${fmt(required)} V for ${TEST_DEFAULTS.hipotSeconds} s, leakage ≤ ${fmt(TEST_DEFAULTS.hipotLeakageMax * 1000)} mA, no breakdown` },
      passed: why.length === 0,
      reason: why.length ? `Hi-pot: ${why.join('; ')}` : '',
      derived: { requiredVoltage: required, appliedVoltage: h.voltage, seconds: h.seconds },
    });
  }

  if (input.insulationResistance) {
    const ir = input.insulationResistance;
    const why: string[] = [];
    if (ir.resistance < TEST_DEFAULTS.insulationResistanceMin) why.push(`${fmt(ir.resistance / 1e6)} MΩ below ${fmt(TEST_DEFAULTS.insulationResistanceMin / 1e6)} MΩ`);
    if (ir.voltage < TEST_DEFAULTS.insulationTestVolts) why.push(`measured at ${fmt(ir.voltage)} V, below ${TEST_DEFAULTS.insulationTestVolts} V DC`);
    readings.push({
      name: 'insulation_resistance',
      value: ir.resistance,
      limit: { min: TEST_DEFAULTS.insulationResistanceMin, text: `≥ ${fmt(TEST_DEFAULTS.insulationResistanceMin / 1e6)} MΩ at ${TEST_DEFAULTS.insulationTestVolts} V DC` },
      passed: why.length === 0,
      reason: why.length ? `Insulation resistance: ${why.join('; ')}` : '',
      derived: { voltage: ir.voltage },
    });
  }

  if (input.inductance !== undefined) {
    const L = result.inductance;
    const band = TEST_DEFAULTS.inductanceTolerancePercent;
    const dev = ((input.inductance - L) / L) * 100;
    const ok = Math.abs(dev) <= band + EDGE_EPSILON;
    readings.push({
      name: 'inductance',
      value: input.inductance,
      limit: { min: L * (1 - band / 100), max: L * (1 + band / 100), text: `${fmt(L)} H ± ${band} %` },
      passed: ok,
      reason: ok ? '' : `Inductance ${fmt(input.inductance)} H is ${pct(dev)} from ${fmt(L)} H, outside ± ${band} %`,
      derived: { computed: L, deviationPercent: dev },
    });
  }

  if (input.turns !== undefined) {
    const N = result.turns;
    const band = Math.max(TEST_DEFAULTS.turnsToleranceMin, (N * TEST_DEFAULTS.turnsTolerancePercent) / 100);
    const diff = input.turns - N;
    const ok = Math.abs(diff) <= band;
    readings.push({
      name: 'turns',
      value: input.turns,
      limit: { min: N - band, max: N + band, text: `${N} turns ± ${fmt(band)}` },
      passed: ok,
      reason: ok ? '' : `Turns ${input.turns} differ from ${N} by ${diff > 0 ? '+' : ''}${diff}, more than ± ${fmt(band)}`,
      derived: { design: N, difference: diff },
    });
  }

  if (input.pull !== undefined && result.pullForce !== undefined) {
    const min = result.pullForce * TEST_DEFAULTS.pullMinFraction;
    const ok = input.pull >= min;
    readings.push({
      name: 'pull',
      value: input.pull,
      limit: { min, text: `≥ ${fmt(min)} N (${TEST_DEFAULTS.pullMinFraction * 100} % of the computed ${fmt(result.pullForce)} N); a check of this unit, never a lifting rating` },
      passed: ok,
      reason: ok ? '' : `Pull ${fmt(input.pull)} N below ${fmt(min)} N`,
      derived: { computed: result.pullForce },
    });
  }

  if (input.heatRun) {
    const hr = input.heatRun;
    // Temperature rise by the resistance method (IEC 60034-1 / IEEE Std 118), from the engine.
    const rise = temperatureRiseByResistance({ ...hr, conductor });
    // The rise measured at the bench, applied at the design's rated ambient; no hot-spot allowance added.
    const winding = spec.ambient + rise;
    const cls = spec.insulationClass;
    const ok = winding <= cls;
    const hUsed = heatTransferUsed(spec);
    const hEff = effectiveHeatTransfer(hUsed, result.temperatureRise, rise);
    readings.push({
      name: 'heat_run',
      value: winding,
      limit: { max: cls, text: `rated ambient ${fmt(spec.ambient)} °C + measured rise ≤ class ${cls} °C` },
      passed: ok,
      reason: ok ? '' : `Heat run: winding ${fmt(winding)} °C (ambient ${fmt(spec.ambient)} °C + rise ${fmt(rise)} K) over class ${cls} °C`,
      derived: { rise, predictedRise: result.temperatureRise, heatTransferUsed: hUsed, ...(hEff !== null && { heatTransferEffective: hEff }) },
    });
  }

  const reasons = readings.filter((r) => !r.passed).map((r) => r.reason);
  return { resistance20: r20, nominalResistance20: nominal, tolerancePercent, deviationPercent, deviationOhms, readings, passed: reasons.length === 0, reasons };
}
