/**
 * A shipment's documents, drawn with pdfkit in the shop's look (jobs/pdf/canvas.ts): the packing
 * list (what is in the boxes, against which PO lines) and the certificate of conformance (each
 * unit's serial with its recorded test summary, the build sheet, wire lots, instruments and who
 * released the design, signed by the shipping user). Masses and lengths in SI with the inch-pound
 * value beside them (customers abroad read either).
 */
import { formatNumber, KG_PER_POUND, MM_PER_INCH, UNIT_SPACE } from '../../src/lib/units';
import { createCanvas } from '../pdf/canvas';
import { barcodePng, CAUTIONS, eng } from '../travelers/render';

export type DocAddress = { line1: string; line2: string; city: string; region: string; postalCode: string; country: string };
export type DocItem = {
  purchaseOrder: string;
  orderNumber: string;
  lineNo: number;
  customerPartNumber: string;
  title: string;
  workOrderNumber: string;
  quantity: number;
  serials: string[];
};
export type DocHeader = {
  shopName: string;
  paper: 'A4' | 'LETTER';
  number: string;
  shipDate: string;
  customerName: string;
  shipTo: DocAddress;
  attention: string;
  carrier: string;
  service: string;
  trackingNumber: string;
  generatedAt: Date;
};
export type PackingListData = DocHeader & {
  packages: { weight: number; length: number; width: number; height: number }[];
  packingNote: string;
  items: DocItem[];
};
export type CertificateUnit = {
  serial: string;
  /** 'passed', or 'use_as_is' (failed, accepted under an approved disposition). */
  verdict: 'passed' | 'use_as_is';
  resistance20: number;
  nominalResistance20: number;
  tolerancePercent: number;
  deviationPercent: number;
  hipot: { voltage: number; seconds: number; leakage: number; passed: boolean } | null;
  insulation: { voltage: number; resistance: number; passed: boolean } | null;
  testedAt: string;
};
export type CertificateData = DocHeader & {
  groups: (DocItem & {
    buildSheet: { version: number; engineVersion: string; approvedBy: string | null; approvedAt: string | null; releasedBy: string | null; releasedAt: string | null };
    wireLots: { lot: string; supplier: string | null }[];
    units: CertificateUnit[];
  })[];
  instruments: { name: string; kind: string; serial: string; calibrationDue: string }[];
  signedBy: string;
  signedOn: string;
};

const kg = (v: number) => `${formatNumber(v, 2)}${UNIT_SPACE}kg (${formatNumber(v / KG_PER_POUND, 2)}${UNIT_SPACE}lb)`;
const dims = (p: { length: number; width: number; height: number }) =>
  `${formatNumber(p.length, 0)} × ${formatNumber(p.width, 0)} × ${formatNumber(p.height, 0)}${UNIT_SPACE}mm (${[p.length, p.width, p.height].map((x) => formatNumber(x / MM_PER_INCH, 1)).join(' × ')}${UNIT_SPACE}in)`;
const addressLines = (a: DocAddress) => [a.line1, a.line2, [a.postalCode, a.city].filter(Boolean).join(' '), a.region, a.country].filter((s) => s && s.trim());
const stamp = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/**
 * Serials in runs: "WO-26-00012-001 – 025, 027" (same prefix, consecutive numbers). Every serial
 * is still listed on the certificate, one row each.
 */
export function compactSerials(serials: string[]): string {
  const parsed = serials.map((s) => {
    const m = /^(.*?)(\d+)$/.exec(s);
    return m ? { s, prefix: m[1], n: Number(m[2]), digits: m[2].length } : { s, prefix: s, n: NaN, digits: 0 };
  });
  const out: string[] = [];
  let i = 0;
  while (i < parsed.length) {
    const a = parsed[i];
    let j = i;
    while (j + 1 < parsed.length && Number.isFinite(a.n) && parsed[j + 1].prefix === a.prefix && parsed[j + 1].n === parsed[j].n + 1) j++;
    const b = parsed[j];
    out.push(j - i >= 2 ? `${a.s} – ${String(b.n).padStart(b.digits, '0')}` : parsed.slice(i, j + 1).map((x) => x.s).join(', '));
    i = j + 1;
  }
  return out.join(', ');
}

function commonTop(c: ReturnType<typeof createCanvas>, d: DocHeader) {
  const to = addressLines(d.shipTo);
  c.kv(
    [
      ['Ship date', d.shipDate],
      ['Customer', d.customerName],
      ['Carrier · service', [d.carrier, d.service].filter(Boolean).join(' · ')],
      ['Tracking number', d.trackingNumber || 'none (no tracking)'],
      ['Ship to', to.join(', ') || '—'],
      ['Attention', d.attention || '—'],
    ],
    2,
  );
}

export async function renderPackingList(d: PackingListData): Promise<Buffer> {
  const c = createCanvas({ paper: d.paper, title: `Packing list ${d.number}`, author: d.shopName, subject: d.customerName });
  c.header('PACKING LIST · SHIPMENT', d.number, await barcodePng(d.number));
  commonTop(c, d);

  const total = d.packages.reduce((s, p) => s + p.weight, 0);
  c.sectionTitle(`Packages: ${d.packages.length}, total ${kg(total)}`);
  c.table(
    ['Package', 'Weight', 'Length × width × height'],
    [70, 170, c.width - 240],
    d.packages.map((p, i) => [`${i + 1} of ${d.packages.length}`, kg(p.weight), dims(p)]),
  );

  const units = d.items.reduce((s, i) => s + i.quantity, 0);
  c.sectionTitle(`Contents: ${units} unit(s)`);
  c.table(
    ['Your PO', 'Our order', 'Line', 'Your part no.', 'Description', 'Qty', 'Serials'],
    [70, 72, 28, 70, 110, 30, c.width - 380],
    d.items.map((i) => [i.purchaseOrder, i.orderNumber, String(i.lineNo), i.customerPartNumber || '—', `${i.title} (${i.workOrderNumber})`, String(i.quantity), compactSerials(i.serials)]),
    { bold: [0, 5] },
  );
  if (d.packingNote) {
    c.sectionTitle('Packing note', 20);
    c.paragraph(d.packingNote);
  }
  c.sectionTitle('Received by', 40);
  c.paragraph('Name ____________________________    Date ____________    Signature ____________________________    Damage noted: yes / no');
  return c.finish((p, n) => `${d.number} · packing list · ${d.shopName} · drawn ${stamp(d.generatedAt)} · page ${p} of ${n}`);
}

const ohms = (v: number) => eng(v, 'Ω', 4);

export async function renderCertificate(d: CertificateData): Promise<Buffer> {
  const c = createCanvas({ paper: d.paper, title: `Certificate of conformance ${d.number}`, author: d.shopName, subject: d.customerName });
  c.header('CERTIFICATE OF CONFORMANCE · SHIPMENT', d.number, await barcodePng(d.number));
  commonTop(c, d);

  const hipotVolts = new Set<number>();
  for (const g of d.groups) {
    c.sectionTitle(`${g.purchaseOrder} · ${g.orderNumber} line ${g.lineNo}${g.customerPartNumber ? ` · part ${g.customerPartNumber}` : ''} — ${g.title}`, 80);
    const s = g.buildSheet;
    c.paragraph(
      `Work order ${g.workOrderNumber}, ${g.quantity} unit(s). Built to build sheet v${s.version} (coil engine ${s.engineVersion}), approved by ${s.approvedBy ?? '—'}${s.approvedAt ? ` on ${s.approvedAt.slice(0, 10)}` : ''}, released by ${s.releasedBy ?? '—'}${s.releasedAt ? ` on ${s.releasedAt.slice(0, 10)}` : ''}.`,
    );
    c.paragraph(`Magnet wire lots: ${g.wireLots.length ? g.wireLots.map((l) => `${l.lot}${l.supplier ? ` (${l.supplier})` : ''}`).join(', ') : 'not recorded'}.`, { color: '#3a3f45' });
    c.table(
      ['Serial', 'R at 20 °C measured', 'Nominal ± tolerance', 'Deviation', 'Hi-pot: voltage, time, leakage', 'Insulation resistance', 'Result'],
      [82, 56, 84, 42, 112, 96, c.width - 472],
      g.units.map((u) => {
        if (u.hipot) hipotVolts.add(u.hipot.voltage);
        return [
          u.serial,
          ohms(u.resistance20),
          `${ohms(u.nominalResistance20)} ± ${formatNumber(u.tolerancePercent, 1)} %`,
          `${u.deviationPercent >= 0 ? '+' : ''}${formatNumber(u.deviationPercent, 2)} %`,
          u.hipot ? `${formatNumber(u.hipot.voltage, 0)} V ${formatNumber(u.hipot.seconds, 0)} s, ${eng(u.hipot.leakage, 'A')}: ${u.hipot.passed ? 'pass' : 'fail'}` : 'not tested',
          u.insulation ? `${eng(u.insulation.resistance, 'Ω')} at ${formatNumber(u.insulation.voltage, 0)} V: ${u.insulation.passed ? 'pass' : 'fail'}` : 'not tested',
          u.verdict === 'passed' ? 'Conforms' : 'Use as is',
        ];
      }),
      { size: 7.5, bold: [0] },
    );
  }

  c.sectionTitle('Instruments used');
  c.table(
    ['Instrument', 'Kind', 'Serial', 'Calibration due'],
    [170, 120, 100, c.width - 390],
    d.instruments.length ? d.instruments.map((i) => [i.name, i.kind.replace(/_/g, ' '), i.serial, i.calibrationDue]) : [['None recorded', '', '', '']],
  );

  const concessions = d.groups.some((g) => g.units.some((u) => u.verdict === 'use_as_is'));
  c.sectionTitle('Statement of conformance', 70);
  c.paragraph(
    `We certify that the units listed above were wound and finished to the build sheets named, tested by ${d.shopName} as recorded here with instruments within their calibration, and conform to the requirements of the purchase-order lines named${
      concessions ? ', except the units marked “use as is”, which deviate as recorded and were accepted under a concession approved by our engineer' : ''
    }. Test records are kept and available on request.`,
  );
  c.doc.moveDown(0.6);
  c.paragraph(`Signed for ${d.shopName}: ${d.signedBy}, shipping, on ${d.signedOn}.`, { font: 'Barlow-SemiBold', size: 10 });

  const volts = [...hipotVolts].sort((a, b) => a - b).map((v) => `${formatNumber(v, 0)} V`);
  c.cautions([
    `Hi-pot tested at ${volts.length ? volts.join(', ') : 'the voltages recorded above'} at ${d.shopName}. Repeated hi-pot testing stresses insulation: agree any re-test voltage at incoming inspection with us and follow your own standard. The test uses lethal voltages — interlocked fixture, trained staff, discharge before handling.`,
    CAUTIONS[1],
    'The pull of a lifting or holding magnet stated anywhere is a computed or measured pull, not a lifting rating: never use it to lift or hold a load without the applicable lifting-device standard and a test with a safety factor.',
    CAUTIONS[3],
  ]);
  return c.finish((p, n) => `${d.number} · certificate of conformance · ${d.shopName} · drawn ${stamp(d.generatedAt)} · page ${p} of ${n}`);
}
