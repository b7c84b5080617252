/**
 * The traveler: the paper that follows a work order around the shop. One or two pages, drawn
 * with pdfkit in the shop's look: the work order number as text, as a Code 128 barcode a
 * keyboard-wedge scanner reads back as exactly the number, and as a QR code of its page; the job;
 * the build sheet's essentials in the user's units and in SI; the operating corners, the duty,
 * the switch-off and the resistance band (engine 2 sheets); the iron's B–H picture with its
 * operating points when there is a core; wire to pull; a sign-off row per stage; a test table to
 * fill in by hand; and the cautions (the engine's own for this coil, and the shop's).
 */
import bwipjs from 'bwip-js/node';
import type { UnitPreferences } from '../../src/contracts/auth';
import {
  formatLength,
  formatNumber,
  formatTemperature,
  formatTemperatureDifference,
  UNIT_SPACE,
} from '../../src/lib/units';
import { bhCurvePoints, curveFieldStrength, MU0 } from '../../server/coil';
import type { BuildSheet, CoilSpec, MagneticCircuit } from '../../server/coil/types';
import { ACCENT, BAND, createCanvas, INK, MUTED, RULE, type Canvas } from '../pdf/canvas';

export type TravelerData = {
  shopName: string;
  paper: 'A4' | 'LETTER';
  url: string;
  generatedAt: Date;
  generatedBy: string;
  units: UnitPreferences;
  workOrder: { number: string; quantity: number; dueDate: string | null; priority: string; stage: string };
  order: { number: string; purchaseOrder: string; customerName: string };
  line: { lineNo: number; title: string; customerPartNumber: string | null; tolerancePercent: number; terminationNotes: string; leadNotes: string };
  sheet: { version: number; engineVersion: string; spec: CoilSpec; result: BuildSheet; approvedBy: string | null };
  spoolLots: { lot: string; supplier: string; mass: number }[];
  /** The floor stages a work order passes, in order, for the sign-off rows. */
  stages: { key: string; label: string }[];
  scrapAllowancePercent: number;
};

export const CAUTIONS = [
  'Hi-pot testing uses lethal voltages: test only in an interlocked fixture, by trained staff, with the unit discharged before handling.',
  'Coils can run hot: a winding at its operating temperature can burn skin; over-temperature of the insulation is a fire risk.',
  'A computed pull is not a lifting rating. Never rely on it to lift or hold a load without the applicable lifting-device standard and a test with a safety factor.',
  'These notes do not replace local codes, the shop’s safety procedures or licensed practice; where they differ, those govern.',
];


const si = (v: number, unit: string, digits: number) => `${formatNumber(v, digits)}${UNIT_SPACE}${unit}`;

/** Engineering notation with an SI prefix, e.g. 0.0123 H → 12.3 mH. */
export function eng(v: number | undefined, unit: string, digits = 3): string {
  if (v === undefined || !Number.isFinite(v)) return '—';
  if (v === 0) return `0${UNIT_SPACE}${unit}`;
  const prefixes: [number, string][] = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n']];
  const [scale, p] = prefixes.find(([s]) => Math.abs(v) >= s) ?? prefixes[prefixes.length - 1];
  const scaled = v / scale;
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(Math.abs(scaled))));
  return `${formatNumber(scaled, decimals)}${UNIT_SPACE}${p}${unit}`;
}

export function wireLabel(result: BuildSheet): string {
  const w = result.wire;
  const size = w.size.standard === 'AWG' ? `AWG ${w.size.gauge}` : `${formatNumber(w.size.diameter * 1000, 3)} mm`;
  return `${w.conductor === 'copper' ? 'Copper' : 'Aluminium'} ${size}, grade ${w.grade}`;
}

export function barcodePng(text: string): Promise<Buffer> {
  return bwipjs.toBuffer({ bcid: 'code128', text, scale: 3, height: 12, includetext: false, paddingwidth: 10, paddingheight: 4 });
}
function qrPng(text: string): Promise<Buffer> {
  return bwipjs.toBuffer({ bcid: 'qrcode', text, scale: 3 });
}

/** Renders one traveler to PDF bytes. */
export async function renderTraveler(d: TravelerData): Promise<Buffer> {
  const [barcode, qr] = await Promise.all([barcodePng(d.workOrder.number), qrPng(d.url)]);
  const c = createCanvas({ paper: d.paper, title: `Traveler ${d.workOrder.number}`, author: d.shopName, subject: `${d.order.number} line ${d.line.lineNo}` });
  const { doc, left, width, write, mark, ensureSpace, sectionTitle } = c;

  // ── Header band ──────────────────────────────────────────────────────────────────────────
  const top = doc.page.margins.top;
  doc.rect(left, top, width, 74).fill(BAND);
  doc.rect(left, top + 74, width, 3).fill(ACCENT);
  write(d.shopName, { font: 'Barlow-SemiBold', size: 11, color: '#ffffff', x: left + 12, y: top + 10 });
  write('TRAVELER · WORK ORDER', { font: 'Barlow-SemiBold', size: 8, color: '#c8ccd1', x: left + 12, y: top + 28 });
  write(d.workOrder.number, { font: 'Barlow-Bold', size: 24, color: '#ffffff', x: left + 12, y: top + 40 });
  const bcW = 190;
  doc.rect(left + width - bcW - 74, top + 8, bcW, 58).fill('#ffffff');
  doc.image(barcode, left + width - bcW - 70, top + 12, { fit: [bcW - 8, 50], align: 'center', valign: 'center' });
  doc.rect(left + width - 66, top + 8, 58, 58).fill('#ffffff');
  doc.image(qr, left + width - 62, top + 12, { fit: [50, 50] });
  doc.y = top + 86;

  // ── The job ──────────────────────────────────────────────────────────────────────────────
  c.kv(
    [
      ['Customer', d.order.customerName],
      ['Order · customer PO', `${d.order.number} · ${d.order.purchaseOrder}`],
      ['Quantity in this work order', `${d.workOrder.quantity} units`],
      ['Due', d.workOrder.dueDate ?? 'not set'],
      ['Priority', d.workOrder.priority],
      ['Customer part number', d.line.customerPartNumber || '—'],
    ],
    3,
  );
  write('Line', { size: 7.5, color: MUTED, x: left, y: doc.y, width });
  write(`${d.line.lineNo}. ${d.line.title}`, { font: 'Barlow-SemiBold', size: 10, x: left, y: doc.y + 1, width });

  // ── Build ────────────────────────────────────────────────────────────────────────────────
  const { spec, result: r } = d.sheet;
  const u = d.units;
  sectionTitle(`Build — sheet v${d.sheet.version}${d.sheet.approvedBy ? `, approved by ${d.sheet.approvedBy}` : ''}`);
  const rTol = d.line.tolerancePercent / 100;
  const pullingLength = r.wireLength * d.workOrder.quantity * (1 + d.scrapAllowancePercent / 100);
  const pullingMass = r.wireMass * d.workOrder.quantity * (1 + d.scrapAllowancePercent / 100);
  const len = (m: number) => formatLength(m, u.lengthUnit);
  const rows: [string, string, string][] = [
    ['Magnet wire', wireLabel(r), `bare ${si(r.wire.bareDiameter * 1000, 'mm', 3)}`],
    ['Overall diameter (insulated)', formatLength(r.wire.overallDiameter, u.lengthUnit, u.lengthUnit === 'mm' ? 3 : 4), si(r.wire.overallDiameter * 1000, 'mm', 3)],
    ['Winding pattern', spec.pattern, spec.pattern === 'random' && spec.fillFactor ? `fill ${formatNumber(spec.fillFactor, 2)}` : ''],
    ['Turns per layer × layers', `${r.turnsPerLayer} × ${r.layers}`, ''],
    ['Total turns', formatNumber(r.turns, 0), ''],
    ['Bobbin: inner Ø / outer Ø limit / traverse', `${len(spec.bobbin.innerDiameter)} / ${len(spec.bobbin.outerDiameter)} / ${len(spec.bobbin.length)}`, `${si(spec.bobbin.innerDiameter * 1000, 'mm', 2)} / ${si(spec.bobbin.outerDiameter * 1000, 'mm', 2)} / ${si(spec.bobbin.length * 1000, 'mm', 2)}`],
    ['Built outer diameter', len(r.outerDiameter), si(r.outerDiameter * 1000, 'mm', 2)],
    ['Lead length (both leads)', len(spec.leadLength ?? 0), si((spec.leadLength ?? 0) * 1000, 'mm', 0)],
    ['Wire per unit', `${si(r.wireLength, 'm', 1)}, ${si(r.wireMass * 1000, 'g', 1)}`, ''],
    [`Wire to pull for ${d.workOrder.quantity} (+${d.scrapAllowancePercent} % scrap)`, `${si(pullingLength, 'm', 0)}, ${si(pullingMass, 'kg', 3)}`, ''],
    ['R at 20 °C, nominal (tolerance band)', `${eng(r.resistance20, 'Ω')} ± ${d.line.tolerancePercent} %`, `${eng(r.resistance20 * (1 - rTol), 'Ω')} … ${eng(r.resistance20 * (1 + rTol), 'Ω')}`],
    ['Supply', spec.drive.kind === 'voltage' ? si(spec.drive.volts, 'V', 1) : si(spec.drive.amps, 'A', 3), `duty ${formatNumber(spec.dutyCycle * 100, 0)} %`],
    ['Current and power, hot', `${eng(r.currentHot, 'A')}, ${eng(r.powerHot, 'W')}`, `${formatNumber(r.ampereTurnsHot, 0)} ampere-turns`],
    ['Winding temperature vs class', `${formatTemperature(r.windingTemperature, u.temperatureUnit)} (rise ${formatTemperatureDifference(r.temperatureRise, u.temperatureUnit)}), class ${spec.insulationClass}`, `${si(r.windingTemperature, '°C', 1)} at ${si(r.ambient, '°C', 0)} ambient`],
    r.pullForce !== undefined
      ? ['Expected pull at the gap', eng(r.pullForce, 'N'), `gap flux density ${eng(r.gapFluxDensity, 'T')}`]
      : ['Expected field at the centre (air core)', eng(r.centreField, 'T'), ''],
    ['Inductance', eng(r.inductance, 'H'), `L/R ${eng(r.timeConstant, 's')}`],
  ];
  const c1 = 190;
  const c2 = 170;
  const c3 = width - c1 - c2;
  write('Quantity', { size: 7.5, color: MUTED, x: left, y: doc.y });
  write(`Value (${u.lengthUnit}, °${u.temperatureUnit})`, { size: 7.5, color: MUTED, x: left + c1, y: doc.y });
  write('SI / detail', { size: 7.5, color: MUTED, x: left + c1 + c2, y: doc.y });
  doc.y += 11;
  for (const [k, v, s] of rows) {
    ensureSpace(16);
    const y = doc.y;
    doc.moveTo(left, y).lineTo(left + width, y).lineWidth(0.5).strokeColor(RULE).stroke();
    write(k, { size: 8.5, color: MUTED, x: left, y: y + 3, width: c1 - 6 });
    write(v, { font: 'Barlow-SemiBold', size: 9, x: left + c1, y: y + 3, width: c2 - 6 });
    write(s, { size: 8.5, color: MUTED, x: left + c1 + c2, y: y + 3, width: c3 });
    doc.y = Math.max(doc.y, y + 15);
  }
  if (r.warnings.length) {
    ensureSpace(14 * r.warnings.length + 6);
    doc.moveDown(0.3);
    for (const w of r.warnings) {
      mark(left, doc.y);
      write(w.message, { size: 8.5, color: '#8a3b12', x: left + 12, y: doc.y, width: width - 12 });
    }
  }

  // ── Corners, duty, switch-off (sheets computed by engine 2) ─────────────────────────────
  const T = (c: number) => formatTemperature(c, u.temperatureUnit, 0);
  const supply = (v: number) => (spec.drive.kind === 'voltage' ? si(v, 'V', 1) : si(v, 'A', 3));
  if (r.corners) {
    sectionTitle('Operating corners — target met at low, class judged at high');
    const withPull = r.corners.nominal.pullForce !== undefined;
    const corner = (name: string, k: BuildSheet['corners']['low']) => [
      name,
      supply(k.supply),
      T(k.ambient),
      k.runaway ? 'runaway' : T(k.windingTemperature),
      eng(k.resistance, 'Ω'),
      eng(k.current, 'A'),
      `${formatNumber(k.ampereTurns, 0)}`,
      ...(withPull ? [eng(k.pullForce, 'N')] : []),
    ];
    const headers = ['Corner', 'Supply', 'Ambient', 'Winding', 'R', 'Current', 'A·turns', ...(withPull ? ['Pull'] : [])];
    const rest = (width - 80) / (headers.length - 1);
    c.table(headers, [80, ...headers.slice(1).map(() => rest)], [corner('Low', r.corners.low), corner('Nominal', r.corners.nominal), corner('High', r.corners.high)], { bold: [0] });
  }
  if (r.duty || r.switchOff || r.resistanceBand) {
    const pairs: [string, string][] = [];
    if (r.resistanceBand) pairs.push(['R at 20 °C acceptance (no tolerance stated)', `${eng(r.resistanceBand.min, 'Ω')} … ${eng(r.resistanceBand.max, 'Ω')}`]);
    if (r.duty) {
      pairs.push(['Duty peak at the high corner', `${T(r.duty.peakTemperature)} (limit ${T(r.duty.limitTemperature)})`]);
      pairs.push(['Longest on-time from cold', r.duty.maxOnTimeFromCold === null ? 'unlimited' : eng(r.duty.maxOnTimeFromCold, 's')]);
    }
    if (r.switchOff) {
      const so = r.switchOff;
      pairs.push(['Suppression', `${so.kind === 'diode-zener' ? 'diode and Zener' : so.kind}${so.assumed ? ' (assumed)' : ''}`]);
      pairs.push(['Stored energy · peak across the switch', `${eng(so.storedEnergy, 'J')} · ${so.peakVoltage === null ? 'unlimited (arcs)' : si(so.peakVoltage, 'V', 0)}`]);
      pairs.push(['Release time to 10 %', so.decayTime === null ? '—' : eng(so.decayTime, 's')]);
    }
    sectionTitle('Band, duty and switch-off');
    c.kv(pairs, 3);
  }
  if (spec.magneticCircuit && r.gapFluxDensity !== undefined) bhPicture(c, spec.magneticCircuit, r);

  // ── Wire reserved ────────────────────────────────────────────────────────────────────────
  sectionTitle('Wire reserved from stock');
  if (!d.spoolLots.length) write('No spool is reserved for this work order: ask the engineer before winding.', { size: 9, x: left, y: doc.y, width });
  for (const s of d.spoolLots) write(`Lot ${s.lot} (${s.supplier}) — ${si(s.mass, 'kg', 3)}`, { size: 9, x: left, y: doc.y, width });
  if (d.line.terminationNotes || d.line.leadNotes) {
    sectionTitle('Termination and leads');
    if (d.line.terminationNotes) write(d.line.terminationNotes, { size: 9, x: left, y: doc.y, width });
    if (d.line.leadNotes) write(d.line.leadNotes, { size: 9, x: left, y: doc.y, width });
  }

  // ── Sign-off per stage ───────────────────────────────────────────────────────────────────
  const grid = (headers: string[], widths: number[], count: number, firstCol: (i: number) => string, rowH = 20) => {
    ensureSpace(14 + rowH * Math.min(count, 3));
    let y = doc.y;
    let x = left;
    headers.forEach((h, i) => {
      write(h, { size: 7.5, color: MUTED, x: x + 3, y });
      x += widths[i];
    });
    y += 11;
    for (let i = 0; i < count; i++) {
      if (y + rowH > doc.page.height - doc.page.margins.bottom) {
        doc.addPage();
        y = doc.page.margins.top;
      }
      x = left;
      widths.forEach((w, c) => {
        doc.rect(x, y, w, rowH).lineWidth(0.6).strokeColor(RULE).stroke();
        if (c === 0) write(firstCol(i), { font: 'Barlow-SemiBold', size: 8.5, x: x + 4, y: y + 6, width: w - 8 });
        x += w;
      });
      y += rowH;
    }
    doc.y = y + 4;
  };
  sectionTitle('Sign-off at each stage');
  grid(['Stage', 'Operator', 'Date', 'Station', 'Notes'], [100, 110, 70, 80, width - 360], d.stages.length, (i) => d.stages[i].label);

  // ── Test record by hand ──────────────────────────────────────────────────────────────────
  sectionTitle(`Tests by hand — R at 20 °C within ${eng(r.resistance20 * (1 - rTol), 'Ω')} … ${eng(r.resistance20 * (1 + rTol), 'Ω')}; enter every reading in Spoolwright too`);
  const testRows = Math.min(d.workOrder.quantity, 12);
  grid(['Serial', 'R measured (Ω)', 'at °C', 'Hi-pot V / s / leakage', 'IR (MΩ)', 'Pass / fail', 'Initials'], [70, 80, 50, 120, 60, 60, width - 440], testRows, () => '');

  // ── Cautions, and the footer on every page ───────────────────────────────────────────────
  // The engine's cautions for this coil (switch-off, stored charge, hot surface, field, pinching,
  // lifting) with the shop's hi-pot caution and the word on local codes; a sheet of engine 1 keeps
  // the shop's general list.
  const own = r.cautions ?? [];
  const has = (code: string) => own.some((x) => x.code === code);
  c.cautions(
    own.length
      ? [CAUTIONS[0], ...own.map((x) => x.message), ...(has('hot-surface') ? [] : [CAUTIONS[1]]), ...(has('lifting') ? [] : [CAUTIONS[2]]), CAUTIONS[3]]
      : CAUTIONS,
  );
  return c.finish(
    (page, pages) =>
      `${d.workOrder.number} · build sheet v${d.sheet.version} · engine ${d.sheet.engineVersion} · printed ${d.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by ${d.generatedBy} · page ${page} of ${pages}`,
  );
}

/**
 * The iron's B–H picture on the traveler: the curve (or the linear model with its cap) and the
 * stored operating points of the corners, H read off the stored B on the same curve.
 */
function bhPicture(c: Canvas, m: MagneticCircuit, r: BuildSheet) {
  const { doc, left, write, ensureSpace, sectionTitle } = c;
  const hOf = (b: number) => (m.bhCurve ? curveFieldStrength(m.bhCurve, b) : b / (MU0 * m.relativePermeability));
  const points: { name: string; B: number }[] = r.corners
    ? [
        { name: 'low', B: r.corners.low.gapFluxDensity ?? 0 },
        { name: 'nominal', B: r.corners.nominal.gapFluxDensity ?? 0 },
        { name: 'high', B: r.corners.high.gapFluxDensity ?? 0 },
      ]
    : [{ name: 'operating point', B: r.gapFluxDensity ?? 0 }];
  const pts = points.map((p) => ({ ...p, H: hOf(Math.min(p.B, m.bhCurve ? Infinity : m.saturationFluxDensity)) }));
  const kneeH = hOf(m.saturationFluxDensity);
  const hMax = Math.max(2.5 * Math.max(...pts.map((p) => p.H)), 1.15 * kneeH) || 1;
  const curve = bhCurvePoints(m, hMax);
  const bMax = Math.max(...curve.map((p) => p.B), m.saturationFluxDensity) * 1.1;
  sectionTitle(`Iron: ${m.bhCurve ? 'B–H curve' : 'linear µr capped at saturation'} and operating points`, 170);
  ensureSpace(160);
  const x0 = left + 40;
  const y0 = doc.y + 6;
  const w = 300;
  const h = 120;
  const sx = (H: number) => x0 + (H / hMax) * w;
  const sy = (B: number) => y0 + h - (B / bMax) * h;
  doc.rect(x0, y0, w, h).lineWidth(0.6).strokeColor(RULE).stroke();
  curve.forEach((p, i) => (i ? doc.lineTo(sx(p.H), sy(p.B)) : doc.moveTo(sx(p.H), sy(p.B))));
  doc.lineWidth(1.6).strokeColor(ACCENT).stroke();
  doc.moveTo(x0, sy(m.saturationFluxDensity)).lineTo(x0 + w, sy(m.saturationFluxDensity)).dash(4, { space: 3 }).lineWidth(0.8).strokeColor('#a8261f').stroke().undash();
  write(`${m.bhCurve ? 'knee' : 'saturation'} ${formatNumber(m.saturationFluxDensity, 2)} T`, { size: 7.5, color: '#a8261f', x: x0 + w + 4, y: sy(m.saturationFluxDensity) - 4 });
  pts.forEach((p, i) => {
    doc.circle(sx(p.H), sy(p.B), 3).lineWidth(1.2).strokeColor(INK).stroke();
    write(p.name, { size: 7.5, x: sx(p.H) + [5, 6, -40][i % 3], y: sy(p.B) + [3, -4, -11][i % 3] });
  });
  write(`${formatNumber(bMax, 1)} T`, { size: 7, color: MUTED, x: left, y: y0 - 3 });
  write('0', { size: 7, color: MUTED, x: x0 - 8, y: y0 + h - 4 });
  write(`H in the iron, 0 … ${formatNumber(hMax >= 1e4 ? hMax / 1000 : hMax, 0)} ${hMax >= 1e4 ? 'kA/m' : 'A/m'}`, { size: 7.5, color: MUTED, x: x0, y: y0 + h + 4 });
  const text = pts.map((p) => `${p.name} ${formatNumber(p.B, 3)} T at ${formatNumber(p.H, 0)} A/m`).join(' · ');
  write(text, { size: 8, x: x0 + w + 4, y: y0 + 20, width: c.width - (x0 - left) - w - 8 });
  doc.y = y0 + h + 18;
}
