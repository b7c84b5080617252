/**
 * The customer and internal e-mails, rendered from a notification's payload (captured when the
 * event happened) into a subject, plain text and HTML in the shop's look. One function per kind.
 */
export type MailContext = { shopName: string; publicUrl: string };
/** A file to attach, fetched by the processor (for example a certificate from the object store). */
export type MailAttachment = { filename: string; content: Buffer; contentType: string };
export type RenderedMail = { subject: string; text: string; html: string; attachments?: MailAttachment[] };
type Payload = Record<string, unknown>;
type Line = { lineNo: number; quantity: number; title: string; customerPartNumber?: string | null };
type ShipmentLine = Line & { shippedNow: number; serialCount: number; shippedTotal: number; remaining: number };
type ShipmentOrder = { orderId: number; orderNumber: string; purchaseOrder: string; dueDate: string; lines: ShipmentLine[] };

const esc = (s: unknown) =>
  String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const fmtDate = (iso: unknown) => {
  if (typeof iso !== 'string' || !iso) return 'not set';
  const d = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
  return d.toLocaleDateString('en-GB', { day: '2-digit', month: 'short', year: 'numeric', timeZone: 'UTC' });
};

const orderLink = (ctx: MailContext, p: Payload) => `${ctx.publicUrl.replace(/\/$/, '')}/orders/${p.orderId}`;

function linesText(lines: Line[]) {
  return lines.map((l) => `  ${l.lineNo}. ${l.quantity} × ${l.title}${l.customerPartNumber ? ` (your part ${l.customerPartNumber})` : ''}`).join('\n');
}
function linesHtml(lines: Line[]) {
  const rows = lines
    .map(
      (l) =>
        `<tr><td style="padding:4px 8px;color:#5b6169">${l.lineNo}</td><td style="padding:4px 8px;text-align:right">${l.quantity}&nbsp;×</td><td style="padding:4px 8px">${esc(l.title)}${
          l.customerPartNumber ? ` <span style="color:#5b6169">(your part ${esc(l.customerPartNumber)})</span>` : ''
        }</td></tr>`,
    )
    .join('');
  return `<table style="border-collapse:collapse;font-size:14px;margin:8px 0 16px">${rows}</table>`;
}

/** The shop's frame: graphite header with the copper rule, body, footer. */
function frame(ctx: MailContext, title: string, body: string) {
  return `<!doctype html><html><body style="margin:0;background:#f3f4f5;font-family:Barlow,'Segoe UI',Arial,sans-serif;color:#1e2126">
<table role="presentation" width="100%" style="border-collapse:collapse"><tr><td align="center" style="padding:24px 12px">
<table role="presentation" width="600" style="border-collapse:collapse;background:#ffffff;border:1px solid #d9dcdf">
<tr><td style="background:#23272d;color:#ffffff;padding:16px 24px;font-size:18px;font-weight:600;border-bottom:3px solid #b8632f">${esc(ctx.shopName)}</td></tr>
<tr><td style="padding:24px"><h1 style="font-size:20px;margin:0 0 12px">${esc(title)}</h1>${body}</td></tr>
<tr><td style="padding:12px 24px;font-size:12px;color:#5b6169;border-top:1px solid #e6e8ea">Sent by ${esc(ctx.shopName)}. Reply to this message if anything is not as you expect.</td></tr>
</table></td></tr></table></body></html>`;
}

const button = (href: string, label: string) =>
  `<p style="margin:20px 0"><a href="${esc(href)}" style="background:#b8632f;color:#ffffff;text-decoration:none;padding:10px 16px;font-weight:600">${esc(label)}</a></p>`;

/** The order's references, as every customer message states them. */
const orderFactsText = (p: Payload) => [
  `Your purchase order: ${p.purchaseOrder}`,
  `Our order number:    ${p.orderNumber}`,
  `Requested ship date: ${fmtDate(p.dueDate)}`,
];

/** The plain-text close of every message: where to follow the order, and who wrote. */
const signOffText = (ctx: MailContext, link: string) => [`Follow the order: ${link}`, ``, `— ${ctx.shopName}`];

const renderers: Record<string, (p: Payload, ctx: MailContext) => RenderedMail> = {
  order_acknowledged(p, ctx) {
    const lines = (p.lines as Line[]) ?? [];
    const subject = `Order received: your PO ${p.purchaseOrder} (our ${p.orderNumber})`;
    const link = orderLink(ctx, p);
    const text = [
      `Thank you — we have your order.`,
      ``,
      ...orderFactsText(p),
      ``,
      `Lines:`,
      linesText(lines),
      ``,
      `What happens next: our engineers turn each line into a build sheet. We will write again when`,
      `the order is released to the winding floor, and when it ships, with the tracking number.`,
      ``,
      ...signOffText(ctx, link),
    ].join('\n');
    const html = frame(
      ctx,
      'We have your order',
      `<p>Thank you. Your purchase order <strong>${esc(p.purchaseOrder)}</strong> is entered as our order <strong>${esc(p.orderNumber)}</strong>, requested to ship by <strong>${esc(fmtDate(p.dueDate))}</strong>.</p>
${linesHtml(lines)}
<p><strong>What happens next:</strong> our engineers turn each line into a build sheet. We will write again when the order is released to the winding floor, and when it ships, with the tracking number.</p>
${button(link, 'Follow the order')}`,
    );
    return { subject, text, html };
  },

  order_released(p, ctx) {
    const lines = (p.lines as Line[]) ?? [];
    const line = p.line as Line | undefined;
    const what = line ? `line ${line.lineNo}, ${line.quantity} × ${line.title}` : 'your order';
    const batches = Number(p.workOrderCount ?? 0);
    const subject = `In production: your PO ${p.purchaseOrder} (our ${p.orderNumber})`;
    const link = orderLink(ctx, p);
    const text = [
      `Your order is on the winding floor.`,
      ``,
      `We released ${what} to production on ${fmtDate(p.releasedAt)}${batches > 1 ? `, in ${batches} batches` : ''}.`,
      ``,
      ...orderFactsText(p),
      ``,
      `Lines on the order:`,
      linesText(lines),
      ``,
      `What happens next: each coil is wound, terminated, impregnated and tested against its build`,
      `sheet. We will write again when it ships, with the tracking number. Other lines of the order`,
      `follow as their build sheets are released.`,
      ``,
      ...signOffText(ctx, link),
    ].join('\n');
    const html = frame(
      ctx,
      'Your order is in production',
      `<p>We released <strong>${esc(what)}</strong> of your purchase order <strong>${esc(p.purchaseOrder)}</strong> (our order <strong>${esc(p.orderNumber)}</strong>) to the winding floor on <strong>${esc(fmtDate(p.releasedAt))}</strong>${batches > 1 ? `, in ${batches} batches` : ''}. Requested ship date: <strong>${esc(fmtDate(p.dueDate))}</strong>.</p>
${linesHtml(lines)}
<p><strong>What happens next:</strong> each coil is wound, terminated, impregnated and tested against its build sheet. We will write again when it ships, with the tracking number. Other lines of the order follow as their build sheets are released.</p>
${button(link, 'Follow the order')}`,
    );
    return { subject, text, html };
  },

  /** The customer's shipment notice; the processor attaches the certificate of conformance. */
  shipment_sent(p, ctx) {
    const orders = (p.orders as ShipmentOrder[]) ?? [];
    const base = ctx.publicUrl.replace(/\/$/, '');
    const link = (o: ShipmentOrder) => `${base}/portal/orders/${o.orderId}`;
    const pos = orders.map((o) => o.purchaseOrder).join(', ');
    const subject = `Shipped: ${p.shipmentNumber} for your PO ${pos}${p.trackingNumber ? ` — tracking ${p.trackingNumber}` : ''}`;
    const how = [p.carrier, p.service].filter(Boolean).join(', ');
    const tracking = p.trackingNumber ? String(p.trackingNumber) : 'none (delivered without tracking)';
    const open = (l: ShipmentLine) => (l.remaining > 0 ? `${l.remaining} still open` : 'complete');
    const lineName = (l: ShipmentLine) => `${l.lineNo}. ${l.title}${l.customerPartNumber ? ` (your part ${l.customerPartNumber})` : ''}`;
    const text = [
      `Your coils are on their way.`,
      ``,
      `Shipment:        ${p.shipmentNumber}`,
      `Shipped on:      ${fmtDate(p.shipDate)}`,
      `Carrier:         ${how}`,
      `Tracking number: ${tracking}`,
      `Packages:        ${p.packages}`,
      ``,
      ...orders.flatMap((o) => [
        ...orderFactsText(o as unknown as Payload),
        `In this shipment:`,
        ...o.lines
          .filter((l) => l.shippedNow > 0)
          .map((l) => `  ${lineName(l)}: ${l.shippedNow} (${l.serialCount} serial${l.serialCount === 1 ? '' : 's'}); ${l.shippedTotal} of ${l.quantity} shipped so far, ${open(l)}`),
        ...(o.lines.some((l) => l.shippedNow === 0 && l.remaining > 0)
          ? [
              `Still open on this order:`,
              ...o.lines.filter((l) => l.shippedNow === 0 && l.remaining > 0).map((l) => `  ${lineName(l)}: ${l.remaining} of ${l.quantity} to come`),
            ]
          : []),
        ...(orders.length > 1 ? [`Follow this order: ${link(o)}`] : []),
        ``,
      ]),
      `The certificate of conformance is attached: each unit's serial with its test results.`,
      ``,
      ...signOffText(ctx, orders[0] ? link(orders[0]) : `${base}/portal/orders`),
    ].join('\n');
    const rows = (o: ShipmentOrder) =>
      o.lines
        .filter((l) => l.shippedNow > 0 || l.remaining > 0)
        .map(
          (l) =>
            `<tr><td style="padding:4px 8px;color:#5b6169">${l.lineNo}</td><td style="padding:4px 8px">${esc(l.title)}${l.customerPartNumber ? ` <span style="color:#5b6169">(your part ${esc(l.customerPartNumber)})</span>` : ''}</td><td style="padding:4px 8px;text-align:right">${l.shippedNow}</td><td style="padding:4px 8px;text-align:right">${l.shippedTotal} / ${l.quantity}</td><td style="padding:4px 8px">${esc(open(l))}</td></tr>`,
        )
        .join('');
    const html = frame(
      ctx,
      'Your coils have shipped',
      `<p>Shipment <strong>${esc(p.shipmentNumber)}</strong> left us on <strong>${esc(fmtDate(p.shipDate))}</strong> with <strong>${esc(how)}</strong>, ${esc(p.packages)} package(s). Tracking number: <strong>${esc(tracking)}</strong>.</p>
${orders
  .map(
    (o) => `<h2 style="font-size:16px;margin:16px 0 4px">Your PO ${esc(o.purchaseOrder)} <span style="color:#5b6169;font-weight:400">(our order ${esc(o.orderNumber)})</span></h2>
<table style="border-collapse:collapse;font-size:14px;margin:4px 0 8px"><tr style="color:#5b6169;font-size:12px"><td style="padding:4px 8px">Line</td><td style="padding:4px 8px">Item</td><td style="padding:4px 8px">Shipped now</td><td style="padding:4px 8px">Shipped so far</td><td style="padding:4px 8px">Open</td></tr>${rows(o)}</table>
${button(link(o), 'Follow this order')}`,
  )
  .join('')}
<p>The certificate of conformance is attached: each unit's serial with its test results.</p>`,
    );
    return { subject, text, html };
  },

  /** Internal: a unit failed its test (to the foremen); written with the failing record. */
  unit_failed(p, ctx) {
    const reasons = Array.isArray(p.reasons) ? (p.reasons as unknown[]).map(String) : [];
    const link = `${ctx.publicUrl.replace(/\/$/, '')}/work-orders/${p.workOrderId}/tests`;
    const subject = `Unit failed test: ${p.workOrderNumber} serial ${p.serial}${p.retest ? ' (retest)' : ''}`;
    const text = [
      `A unit failed its test and needs your disposition (rework, scrap, or use as is with the engineer's approval).`,
      ``,
      `Work order:      ${p.workOrderNumber}${p.lineTitle ? ` — ${p.lineTitle}` : ''}`,
      `Serial:          ${p.serial}${p.retest ? ' (retest)' : ''}`,
      `Nonconformance:  ${p.nonconformanceId}`,
      ``,
      `What failed:`,
      ...reasons.map((r) => `  - ${r}`),
      ``,
      `Open the tests: ${link}`,
      ``,
      `— ${ctx.shopName}`,
    ].join('\n');
    const html = frame(
      ctx,
      'A unit failed its test',
      `<p>Work order <strong>${esc(p.workOrderNumber)}</strong>${p.lineTitle ? ` (${esc(p.lineTitle)})` : ''}, serial <strong>${esc(p.serial)}</strong>${p.retest ? ' (retest)' : ''}, nonconformance ${esc(p.nonconformanceId)}, needs your disposition: rework, scrap, or use as is with the engineer's approval.</p>
<ul>${reasons.map((r) => `<li>${esc(r)}</li>`).join('')}</ul>
${button(link, 'Open the tests')}`,
    );
    return { subject, text, html };
  },
};

export const MAIL_KINDS = Object.keys(renderers);

/** Renders a notification; an unknown kind is a programming error and fails the job. */
export function renderMail(kind: string, payload: Payload, ctx: MailContext): RenderedMail {
  const r = renderers[kind];
  if (!r) throw new Error(`No e-mail template for notification kind '${kind}'`);
  return r(payload, ctx);
}
