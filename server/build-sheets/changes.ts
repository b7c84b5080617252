/**
 * What changed between two versions of a line's build sheet: the engine that computed each, the
 * spec fields that differ and the key figures that moved. Pure; both results are stored records,
 * so the comparison is the same every time it is read.
 */
import type { SheetChanges } from '../../src/contracts/build-sheets';
import type { BuildSheet, CoilSpec } from '../coil';

type Stored = { version: number; engineVersion: string; spec: CoilSpec; result: BuildSheet };

/** Key figures, SI, with how to read them off a result (engine 1 results lack the corners). */
const FIGURES: { key: string; label: string; unit: string; of: (r: BuildSheet) => number | undefined }[] = [
  { key: 'turns', label: 'Turns', unit: 'turns', of: (r) => r.turns },
  { key: 'resistance20', label: 'Resistance at 20 °C', unit: 'Ω', of: (r) => r.resistance20 },
  { key: 'wireMass', label: 'Wire per unit (insulated from engine 2; copper only before)', unit: 'kg', of: (r) => r.wireMass },
  { key: 'windingTemperature', label: 'Winding temperature, nominal', unit: '°C', of: (r) => r.windingTemperature },
  { key: 'highTemperature', label: 'Winding temperature, high corner', unit: '°C', of: (r) => r.corners?.high.windingTemperature },
  { key: 'powerHot', label: 'Power hot, nominal', unit: 'W', of: (r) => r.powerHot },
  { key: 'ampereTurnsHot', label: 'Ampere-turns hot, nominal', unit: 'A·turns', of: (r) => r.ampereTurnsHot },
  { key: 'lowAmpereTurns', label: 'Ampere-turns, low corner', unit: 'A·turns', of: (r) => r.corners?.low.ampereTurns },
  { key: 'pullForce', label: 'Pull, nominal', unit: 'N', of: (r) => r.pullForce },
  { key: 'lowPull', label: 'Pull, low corner', unit: 'N', of: (r) => r.corners?.low.pullForce },
  { key: 'inductance', label: 'Inductance', unit: 'H', of: (r) => r.inductance },
];

/** Relative change below which a figure counts as unchanged (rounding of the stored JSON is far smaller). */
const SAME = 5e-4;

function differs(a: number | null, b: number | null): boolean {
  if (a === null || b === null) return a !== b;
  if (a === b) return false;
  return Math.abs(a - b) > SAME * Math.max(Math.abs(a), Math.abs(b));
}

/** Dotted paths of the leaves that differ between two plain JSON values. */
function changedPaths(a: unknown, b: unknown, path = ''): string[] {
  if (a !== null && b !== null && typeof a === 'object' && typeof b === 'object' && !Array.isArray(a) && !Array.isArray(b)) {
    const keys = new Set([...Object.keys(a as object), ...Object.keys(b as object)]);
    return [...keys].sort().flatMap((k) => changedPaths((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], path ? `${path}.${k}` : k));
  }
  return JSON.stringify(a) === JSON.stringify(b) ? [] : [path || '(spec)'];
}

export function sheetChanges(previous: Stored | undefined, current: Stored): SheetChanges | null {
  if (!previous) return null;
  const figures = FIGURES.map((f) => ({ key: f.key, label: f.label, unit: f.unit, before: f.of(previous.result) ?? null, after: f.of(current.result) ?? null }))
    .filter((f) => differs(f.before, f.after));
  const codes = (r: BuildSheet) => new Set(r.warnings.map((w) => w.code as string));
  const before = codes(previous.result);
  const after = codes(current.result);
  return {
    fromVersion: previous.version,
    fromEngine: previous.engineVersion,
    toEngine: current.engineVersion,
    engineChanged: previous.engineVersion !== current.engineVersion,
    figures,
    specChanged: changedPaths(previous.spec, current.spec),
    warningsAdded: [...after].filter((c) => !before.has(c)),
    warningsRemoved: [...before].filter((c) => !after.has(c)),
  };
}
