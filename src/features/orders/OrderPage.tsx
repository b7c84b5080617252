import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useLocation, useParams } from 'react-router';
import { ATTACHMENT_TYPES, cancelOrderRequest, ORDER_STATUS_LABELS, type OrderDetail, type OrderEventRecord, type OrderStatus } from '../../contracts/orders';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { Dialog } from '../../components/Dialog';
import { Loading, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { applyServerErrors } from '../../lib/forms';
import { formatBytes, formatDateTime, formatDay, pieces, plural } from '../../lib/format';
import { useCurrentUser, useUnits } from '../../lib/session';
import { customerQuery } from '../customers';
import { OrderWorkOrders } from '../travelers';
import { attachmentHref, orderQuery, uploadAttachment, useAcknowledgeOrder, useCancelOrder, useDeleteAttachment, type AcknowledgeResult } from './api';
import { DropZone, newItem, precheck, UploadList, type UploadItem } from './Drawings';
import type { SavedState } from './OrderFormPage';
import { RequirementFacts } from './Requirement';
import { LateBadge, OrderStatusBadge } from './status';
import { queryClient } from '../../lib/queryClient';

const KIND_LABELS: Record<OrderEventRecord['kind'], string> = {
  created: 'Entered',
  updated: 'Changed',
  acknowledged: 'Acknowledged',
  cancelled: 'Cancelled',
  status_changed: 'Status changed',
  attachment_added: 'File added',
  attachment_removed: 'File removed',
};

const FIELD_LABELS: Record<string, string> = {
  purchaseOrder: 'Purchase order',
  orderDate: 'Order date',
  dueDate: 'Requested ship date',
  notes: 'Notes',
  status: 'Status',
  lines: 'Lines',
  attachment: 'File',
};

function show(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (typeof v === 'string') return (ORDER_STATUS_LABELS as Record<string, string>)[v] ?? v;
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  if (typeof v === 'object' && v && 'title' in v) return `“${String((v as { title: unknown }).title)}”`;
  return 'changed';
}

function describeChange(field: string, [from, to]: [unknown, unknown]): string {
  const m = /^lines\.(\d+)(?:\.(.+))?$/.exec(field);
  if (m) {
    const [, no, rest] = m;
    if (!rest) return from === null ? `Line ${no} added: ${show(to)}` : to === null ? `Line ${no} removed: ${show(from)}` : `Line ${no} changed`;
    if (rest === 'requirement') return `Line ${no}: requirement changed`;
    if (rest === 'lineNo') return `Line ${from} is now line ${to}`;
    return `Line ${no} ${rest.replace(/([A-Z])/g, ' $1').toLowerCase()}: ${show(from)} → ${show(to)}`;
  }
  if (field === 'lines' && from === 0) return `${plural(Number(to), 'line')}`;
  if (field === 'attachment') return from === null ? `${show(to)}` : `${show(from)}`;
  if (field === 'notes') return 'Internal notes changed';
  const label = FIELD_LABELS[field] ?? field;
  return from === null ? `${label}: ${show(to)}` : `${label}: ${show(from)} → ${show(to)}`;
}

/**
 * A line's build sheet as the order page shows it. Read loosely: the build-sheet contract belongs
 * to the engineering feature and is still growing; this shows version, status and, once released,
 * the winding's essentials.
 */
function BuildSheetNote({ sheet, u }: { sheet: unknown; u: ReturnType<typeof useUnits> }) {
  const s = sheet as {
    version?: number;
    status?: string;
    released?: { turns?: number; layers?: number; resistance20?: number; resistance20Min?: number; resistance20Max?: number; windingTemperature?: number } | null;
  };
  const r = s.released;
  const num = (v: number | undefined, d: number) => (typeof v === 'number' ? v.toLocaleString('en-US', { maximumFractionDigits: d }) : '—');
  return (
    <div className="mt-0.5" data-build-sheet={s.status ?? 'present'}>
      <p className="inline-flex items-center gap-1.5 rounded border border-ok/30 bg-ok-soft px-1.5 font-semibold text-ok">
        <svg viewBox="0 0 16 16" className="size-3.5" aria-hidden>
          <circle cx="8" cy="8" r="6.5" fill="currentColor" />
        </svg>
        Version {s.version ?? '?'} · {s.status ? s.status.charAt(0).toUpperCase() + s.status.slice(1) : 'in engineering'}
      </p>
      {r && (
        <p className="mt-1 text-graphite-800">
          {num(r.turns, 0)} turns in {num(r.layers, 0)} layers; {num(r.resistance20, 2)}&nbsp;Ω at {u.temperature(20, 0)} ({num(r.resistance20Min, 2)}–{num(r.resistance20Max, 2)}&nbsp;Ω); winding{' '}
          {u.temperature(r.windingTemperature)} hot
        </p>
      )}
    </div>
  );
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">{label}</dt>
      <dd className="mt-0.5 font-semibold text-graphite-900">{children}</dd>
    </div>
  );
}

function AcknowledgeDialog({ order, onClose, onDone }: { order: OrderDetail; onClose: () => void; onDone: (r: AcknowledgeResult) => void }) {
  const ack = useAcknowledgeOrder();
  const customer = useQuery(customerQuery(order.customer.id));
  const withMail = customer.data?.contacts.filter((c) => c.email) ?? [];
  const chosen = withMail.filter((c) => c.notifyOrders);
  const to = chosen.length ? chosen : withMail.slice(0, 1);
  return (
    <Dialog open title={`Acknowledge ${order.number}`} onClose={onClose}>
      <div className="flex flex-col gap-3">
        <p className="text-graphite-700">
          This confirms to {order.customer.name} that the shop has their order (purchase order {order.purchaseOrder}, ship by {formatDay(order.dueDate)}) and
          records you as the one who acknowledged it. The lines are fixed from then on.
        </p>
        {customer.isPending ? (
          <Loading what="Finding who gets the e-mail" />
        ) : to.length ? (
          <p className="text-graphite-700">
            An acknowledgement e-mail will be queued to{' '}
            <strong>{to.map((c) => `${c.name} <${c.email}>`).join(', ')}</strong>.
          </p>
        ) : (
          <Alert kind="caution" title="Nobody to e-mail">
            {order.customer.name} has no contact with an e-mail address. The order is acknowledged all the same; tell the customer another way.
          </Alert>
        )}
        {ack.isError && <Alert kind="fault" title="Not acknowledged">{errorMessage(ack.error)}</Alert>}
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Not now</Button>
          <Button variant="primary" busy={ack.isPending} onClick={() => ack.mutate(order.id, { onSuccess: onDone })}>
            Acknowledge order
          </Button>
        </div>
      </div>
    </Dialog>
  );
}

function CancelDialog({ order, onClose, onDone }: { order: OrderDetail; onClose: () => void; onDone: () => void }) {
  const cancel = useCancelOrder();
  const [problems, setProblems] = useState<string[]>([]);
  const { register, handleSubmit, setError, formState } = useForm({ resolver: zodResolver(cancelOrderRequest), defaultValues: { reason: '' } });
  const onSubmit = handleSubmit(async ({ reason }) => {
    setProblems([]);
    try {
      await cancel.mutateAsync({ id: order.id, reason });
      onDone();
    } catch (err) {
      setProblems(applyServerErrors(err, setError, ['reason']));
    }
  });
  const error = formState.errors.reason?.message;
  return (
    <Dialog open title={`Cancel ${order.number}`} onClose={onClose}>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
        <p className="text-graphite-700">A cancelled order is final: it cannot be changed, and takes no more files. Its history stays.</p>
        {problems.length > 0 && <Alert kind="fault" title={problems[0]} />}
        <div className="flex flex-col gap-1">
          <label htmlFor="cancel-reason" className="text-sm font-semibold text-graphite-800">
            Reason
          </label>
          <textarea
            id="cancel-reason"
            rows={3}
            aria-invalid={error ? true : undefined}
            className={`rounded-md border px-3 py-2 focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200 ${error ? 'border-fault' : 'border-graphite-300'}`}
            {...register('reason')}
          />
          {error && (
            <p className="text-sm font-medium text-fault" role="alert">
              {error}
            </p>
          )}
        </div>
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Keep the order</Button>
          <Button type="submit" variant="danger" busy={cancel.isPending}>
            Cancel order
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function Attachments({ order, canWrite }: { order: OrderDetail; canWrite: boolean }) {
  const remove = useDeleteAttachment(order.id);
  const [uploads, setUploads] = useState<UploadItem[]>([]);
  const [line, setLine] = useState<number | null>(null);
  const [rejected, setRejected] = useState<string[]>([]);
  const [confirm, setConfirm] = useState<number | null>(null);
  const lineOptions = order.lines.map((l) => ({ value: l.id, label: `Line ${l.lineNo}` }));
  const patch = (key: string, change: Partial<UploadItem>) => setUploads((list) => list.map((it) => (it.key === key ? { ...it, ...change } : it)));
  const mayAttach = canWrite && order.can.attach;

  const send = async (files: File[]) => {
    const bad: string[] = [];
    const items: UploadItem[] = [];
    for (const f of files) {
      const why = precheck(f);
      if (why) bad.push(why);
      else items.push({ ...newItem(f, line), state: 'sending' });
    }
    setRejected(bad);
    setUploads((list) => [...list.filter((x) => x.state !== 'done'), ...items]);
    for (const it of items) {
      try {
        await uploadAttachment(order.id, it.file, it.line, (p) => patch(it.key, { progress: p }));
        patch(it.key, { state: 'done', progress: 1 });
      } catch (err) {
        patch(it.key, { state: 'failed', message: errorMessage(err) });
      }
    }
    await queryClient.invalidateQueries({ queryKey: orderQuery(order.id).queryKey });
  };

  return (
    <Panel title={`Drawings and specifications (${order.attachments.length})`}>
      {order.attachments.length === 0 ? (
        <p className="mb-3 text-graphite-500">No files yet.</p>
      ) : (
        <table className="mb-3 w-full text-sm">
          <caption className="sr-only">Files of this order</caption>
          <thead className="text-left text-graphite-600">
            <tr className="border-b border-graphite-200">
              <th className="py-1 pr-3 font-semibold">File</th>
              <th className="py-1 pr-3 font-semibold">For</th>
              <th className="py-1 pr-3 font-semibold">Kind</th>
              <th className="py-1 pr-3 text-right font-semibold">Size</th>
              <th className="py-1 pr-3 font-semibold">Added</th>
              <th className="py-1">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {order.attachments.map((a) => (
              <tr key={a.id} className="border-b border-graphite-100 last:border-0" data-attachment={a.filename}>
                <td className="max-w-72 truncate py-1.5 pr-3">
                  <a href={attachmentHref(a.id)} download={a.filename} className="font-semibold text-copper-700 underline-offset-2 hover:underline" title={`Download ${a.filename}`}>
                    {a.filename}
                  </a>
                </td>
                <td className="py-1.5 pr-3 whitespace-nowrap">{a.lineId === null ? 'Whole order' : (lineOptions.find((o) => o.value === a.lineId)?.label ?? 'A removed line')}</td>
                <td className="py-1.5 pr-3 whitespace-nowrap" title={a.contentType}>{(ATTACHMENT_TYPES as Record<string, string>)[a.contentType] ?? a.contentType}</td>
                <td className="tabular py-1.5 pr-3 text-right whitespace-nowrap">{formatBytes(a.size)}</td>
                <td className="py-1.5 pr-3 whitespace-nowrap text-graphite-700">
                  {formatDateTime(a.createdAt)}
                  {a.uploadedBy && <span className="text-graphite-500"> · {a.uploadedBy.name}</span>}
                </td>
                <td className="py-1.5 text-right whitespace-nowrap">
                  <a href={attachmentHref(a.id, true)} target="_blank" rel="noreferrer" className={buttonClass('quiet', 'sm')}>
                    View
                  </a>
                  {mayAttach &&
                    (confirm === a.id ? (
                      <span className="ml-1 inline-flex gap-1">
                        <Button size="sm" variant="danger" busy={remove.isPending} onClick={() => remove.mutate(a.id, { onSettled: () => setConfirm(null) })}>
                          Delete {a.filename}?
                        </Button>
                        <Button size="sm" variant="quiet" onClick={() => setConfirm(null)}>
                          Keep
                        </Button>
                      </span>
                    ) : (
                      <Button size="sm" variant="quiet" className="ml-1" onClick={() => setConfirm(a.id)} aria-label={`Delete ${a.filename}`}>
                        Delete
                      </Button>
                    ))}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {remove.isError && <Alert kind="fault" title="Not deleted">{errorMessage(remove.error)}</Alert>}
      {mayAttach && (
        <div className="flex flex-col gap-2">
          <label className="flex items-center gap-2 text-sm font-semibold text-graphite-800">
            New files are for
            <select
              value={line === null ? '' : String(line)}
              onChange={(e) => setLine(e.target.value === '' ? null : Number(e.target.value))}
              className="h-8 rounded-md border border-graphite-300 bg-white px-2 font-normal"
            >
              <option value="">the whole order</option>
              {lineOptions.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          </label>
          <DropZone onFiles={(files) => void send(files)} />
          {rejected.map((r) => (
            <p key={r} className="text-sm font-medium text-fault" role="alert">
              {r}
            </p>
          ))}
          <UploadList items={uploads} lineOptions={lineOptions} onRemove={(key) => setUploads((l) => l.filter((x) => x.key !== key))} />
        </div>
      )}
    </Panel>
  );
}

export function OrderPage() {
  const id = Number(useParams().id);
  const user = useCurrentUser();
  const u = useUnits();
  const location = useLocation();
  const arrived = location.state as SavedState | null;
  const order = useQuery({ ...orderQuery(id), enabled: Number.isInteger(id) && id > 0 });
  const [dialog, setDialog] = useState<'ack' | 'cancel' | null>(null);
  const [notice, setNotice] = useState<{ kind: 'good' | 'caution'; title: string; text?: string } | null>(null);
  const staff = user.role !== 'customer';
  const canWrite = user.role === 'office' || user.role === 'admin';

  if (order.isPending) return <Loading what="Loading the order" />;
  if (order.isError) {
    const missing = isApiError(order.error) && order.error.status === 404;
    return (
      <Alert kind="fault" title={missing ? 'No such order' : 'Could not load the order'}>
        {missing ? 'There is no order at this address that you may see.' : errorMessage(order.error)}{' '}
        <Link to="/orders" className="underline">
          Back to the orders
        </Link>
      </Alert>
    );
  }
  const o = order.data;
  const units = o.lines.reduce((n, l) => n + l.quantity, 0);

  return (
    <div className="flex flex-col gap-4" data-order={o.number}>
      <nav aria-label="Breadcrumb" className="text-sm text-graphite-600">
        <Link to="/orders" className="underline-offset-2 hover:underline">
          {staff ? 'Orders' : 'Your orders'}
        </Link>{' '}
        / {o.number}
      </nav>

      <header className="rounded-lg border border-graphite-200 bg-white px-5 py-4 shadow-[inset_4px_0_0_#b8632e]">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <div className="flex flex-wrap items-center gap-2">
              <h1 className="text-2xl font-bold tracking-tight text-graphite-950">Order {o.number}</h1>
              <OrderStatusBadge status={o.status} />
              {o.late && <LateBadge />}
            </div>
            <p className="mt-0.5 text-graphite-700">
              {staff ? (
                <Link to={`/customers/${o.customer.id}`} className="font-semibold text-copper-700 underline-offset-2 hover:underline">
                  {o.customer.name}
                </Link>
              ) : (
                <span className="font-semibold">{o.customer.name}</span>
              )}{' '}
              · {plural(o.lines.length, 'line')}, {pieces(units)}
            </p>
          </div>
          {canWrite && (
            <div className="flex flex-wrap gap-2">
              {o.can.editLines && (
                <Link to={`/orders/${o.id}/edit`} className={buttonClass('secondary')}>
                  Edit order
                </Link>
              )}
              {o.can.cancel && (
                <Button variant="danger" onClick={() => setDialog('cancel')}>
                  Cancel order…
                </Button>
              )}
              {o.can.acknowledge && (
                <Button variant="primary" onClick={() => setDialog('ack')}>
                  Acknowledge…
                </Button>
              )}
            </div>
          )}
        </div>
        <dl className="mt-3 grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-4 lg:grid-cols-6">
          <Fact label="Purchase order">{o.purchaseOrder}</Fact>
          <Fact label="Ordered">{formatDay(o.orderDate)}</Fact>
          <Fact label="Ship by">
            <span className={o.late ? 'text-fault' : undefined}>{formatDay(o.dueDate)}</span>
          </Fact>
          <Fact label="Status">{ORDER_STATUS_LABELS[o.status as OrderStatus]}</Fact>
          <Fact label="Acknowledged">
            {o.acknowledgedAt ? `${formatDateTime(o.acknowledgedAt)}${o.acknowledgedBy ? ` by ${o.acknowledgedBy.name}` : ''}` : 'Not yet'}
          </Fact>
          {o.cancelledAt ? (
            <Fact label="Cancelled">{formatDateTime(o.cancelledAt)}</Fact>
          ) : (
            <Fact label="Entered">{`${formatDateTime(o.createdAt)}${o.createdBy ? ` by ${o.createdBy.name}` : ''}`}</Fact>
          )}
        </dl>
        {o.cancelReason && <p className="mt-2 text-sm text-graphite-700">Cancelled because: {o.cancelReason}</p>}
      </header>

      {arrived?.saved && !notice && <Alert kind="good" title={arrived.saved} />}
      {arrived?.uploadProblems && arrived.uploadProblems.length > 0 && (
        <Alert kind="fault" title="Some files were not uploaded; the order itself is saved">
          <ul className="list-disc pl-4">
            {arrived.uploadProblems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
          Add them again below.
        </Alert>
      )}
      {notice && (
        <Alert kind={notice.kind} title={notice.title}>
          {notice.text}
        </Alert>
      )}

      {staff && o.notes !== undefined && o.notes !== '' && (
        <Panel title="Internal notes">
          <p className="whitespace-pre-line text-graphite-800">{o.notes}</p>
        </Panel>
      )}

      <section aria-labelledby="lines-h" className="flex flex-col gap-2">
        <h2 id="lines-h" className="text-lg font-semibold text-graphite-900">
          Lines
        </h2>
        <ol className="flex flex-col gap-3">
          {o.lines.map((l) => (
            <li key={l.id} className="rounded-lg border border-graphite-200 bg-white" data-line-no={l.lineNo}>
              <div className="flex flex-wrap items-baseline justify-between gap-2 border-b border-graphite-200 px-4 py-2">
                <h3 className="font-semibold text-graphite-900">
                  <span className="mr-2 text-graphite-500">{l.lineNo}.</span>
                  {l.title}
                  {l.customerPartNumber && <span className="ml-2 text-sm font-normal text-graphite-600">part {l.customerPartNumber}</span>}
                </h3>
                <span className="tabular font-semibold">{pieces(l.quantity)}</span>
              </div>
              <div className="grid gap-4 px-4 py-3 md:grid-cols-[2fr_1fr]">
                <RequirementFacts r={l.requirement} tolerancePercent={l.tolerancePercent} u={u} />
                <div className="flex flex-col gap-2 text-sm">
                  <div>
                    <p className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">Build sheet</p>
                    {l.buildSheet === null ? (
                      <p className="mt-0.5 inline-flex items-center gap-1.5 rounded border border-graphite-300 bg-graphite-50 px-1.5 font-semibold text-graphite-700" data-build-sheet="awaiting">
                        <svg viewBox="0 0 16 16" className="size-3.5" aria-hidden>
                          <circle cx="8" cy="8" r="5.5" fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray="3 2" />
                        </svg>
                        Awaiting engineering
                      </p>
                    ) : (
                      <BuildSheetNote sheet={l.buildSheet} u={u} />
                    )}
                  </div>
                  {l.terminationNotes && (
                    <div>
                      <p className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">Termination</p>
                      <p className="whitespace-pre-line text-graphite-800">{l.terminationNotes}</p>
                    </div>
                  )}
                  {l.leadNotes && (
                    <div>
                      <p className="text-xs font-semibold tracking-wide text-graphite-500 uppercase">Leads</p>
                      <p className="whitespace-pre-line text-graphite-800">{l.leadNotes}</p>
                    </div>
                  )}
                  {l.requirement.target.kind === 'pull' && (
                    <p className="text-xs text-caution">A computed pull is never a lifting rating.</p>
                  )}
                </div>
              </div>
            </li>
          ))}
        </ol>
      </section>

      {staff && <OrderWorkOrders orderId={o.id} />}

      <Attachments order={o} canWrite={canWrite} />

      <Panel title="History">
        <ol className="flex flex-col" aria-label="Order history">
          {[...o.events].reverse().map((e) => {
            const changes = Object.entries(e.changes).map(([f, c]) => describeChange(f, c as [unknown, unknown]));
            return (
              <li key={e.id} className="grid grid-cols-[9.5rem_8rem_1fr] gap-x-3 border-b border-graphite-100 py-1.5 text-sm last:border-0" data-event={e.kind}>
                <span className="tabular whitespace-nowrap text-graphite-600">{formatDateTime(e.at)}</span>
                <span className="font-semibold text-graphite-900">{KIND_LABELS[e.kind]}</span>
                <span className="text-graphite-800">
                  {changes.join('; ')}
                  {e.note && <span className="text-graphite-700">{changes.length ? ' — ' : ''}“{e.note}”</span>}
                  {e.actor && <span className="text-graphite-500"> · {e.actor.name}</span>}
                </span>
              </li>
            );
          })}
        </ol>
      </Panel>

      {dialog === 'ack' && (
        <AcknowledgeDialog
          order={o}
          onClose={() => setDialog(null)}
          onDone={(r) => {
            setDialog(null);
            const n = r.notification;
            setNotice(
              n.status === 'skipped' || n.recipients.length === 0
                ? { kind: 'caution', title: `Order ${r.order.number} is acknowledged. No e-mail was queued.`, text: n.reason ?? 'The customer has no contact with an e-mail address.' }
                : {
                    kind: 'good',
                    title: `Order ${r.order.number} is acknowledged. An acknowledgement e-mail is queued to ${n.recipients.map((x) => x.name).join(', ')}.`,
                    text: n.recipients.map((x) => x.email).join(', '),
                  },
            );
          }}
        />
      )}
      {dialog === 'cancel' && (
        <CancelDialog
          order={o}
          onClose={() => setDialog(null)}
          onDone={() => {
            setDialog(null);
            setNotice({ kind: 'caution', title: `Order ${o.number} is cancelled.` });
          }}
        />
      )}
    </div>
  );
}
