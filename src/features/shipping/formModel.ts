/**
 * The new-shipment form's values and their way to the API. Values are text as typed, weights and
 * dimensions in the user's units (kg and mm, or lb and in); `toRequest` converts them to the
 * contract's SI (kg, mm). The form keeps one entry per work order (`items`); the request's
 * `workOrderIds` and `partial` are made from them, and the contract's (or the server's) messages
 * about `workOrderIds.i` and `partial.j.serials` are put back on the item they are about.
 */
import { createShipmentRequest } from '../../contracts/shipments';
import type { Address } from '../../contracts/customers';
import { EMPTY_ADDRESS } from '../../contracts/customers';
import { parseNumber, throughContract } from '../../lib/forms';
import { todayIso } from '../../lib/format';
import { fromKilograms, fromMetres, massUnitFor, toKilograms, toMetres, type LengthUnit } from '../../lib/units';

export type ItemForm = {
  workOrderId: number;
  /** 'all': every unit not shipped yet; 'some': only the serials ticked. */
  ship: 'all' | 'some';
  serials: string[];
};

export type PackageForm = { weight: string; length: string; width: string; height: string };

export type ShipmentFormValues = {
  items: ItemForm[];
  shipTo: Address;
  attention: string;
  carrier: string;
  service: string;
  trackingNumber: string;
  packages: PackageForm[];
  shipDate: string;
  packingNote: string;
};

/** A checkbox group's value: react-hook-form answers `false` when a lone checkbox is unticked. */
export const ticked = (v: unknown): string[] => (Array.isArray(v) ? v.map(String) : typeof v === 'string' ? [v] : []);

export const emptyPackage = (): PackageForm => ({ weight: '', length: '', width: '', height: '' });

export function emptyShipment(workOrderIds: number[], shipTo: Address | null): ShipmentFormValues {
  return {
    items: workOrderIds.map((workOrderId) => ({ workOrderId, ship: 'all', serials: [] })),
    shipTo: { ...EMPTY_ADDRESS, ...(shipTo ?? {}) },
    attention: '',
    carrier: '',
    service: '',
    trackingNumber: '',
    packages: [emptyPackage()],
    shipDate: todayIso(),
    packingNote: '',
  };
}

/** A length typed in the user's unit → millimetres (the contract's unit for package sizes). */
export const toMillimetres = (value: number, unit: LengthUnit) => toMetres(value, unit) * 1000;
export const fromMillimetres = (mm: number, unit: LengthUnit) => fromMetres(mm / 1000, unit);

export function toRequest(v: ShipmentFormValues, lengthUnit: LengthUnit): unknown {
  const mass = massUnitFor(lengthUnit);
  const num = (s: string, convert: (n: number) => number) => {
    const n = parseNumber(s);
    return n === undefined || Number.isNaN(n) ? n : convert(n);
  };
  const partial = v.items.filter((i) => i.ship === 'some').map((i) => ({ workOrderId: i.workOrderId, serials: ticked(i.serials) }));
  return {
    workOrderIds: v.items.map((i) => i.workOrderId),
    ...(partial.length && { partial }),
    shipTo: v.shipTo,
    attention: v.attention,
    carrier: v.carrier,
    service: v.service,
    trackingNumber: v.trackingNumber,
    packages: v.packages.map((p) => ({
      weight: num(p.weight, (n) => toKilograms(n, mass)),
      length: num(p.length, (n) => toMillimetres(n, lengthUnit)),
      width: num(p.width, (n) => toMillimetres(n, lengthUnit)),
      height: num(p.height, (n) => toMillimetres(n, lengthUnit)),
    })),
    shipDate: v.shipDate,
    packingNote: v.packingNote,
  };
}

/**
 * A request path (from the contract or the server's `fields`) → the form's path: `workOrderIds.i`
 * → the item, `partial.j.…` → the item it names, a message about a whole list → its `root`.
 */
export function formPath(path: readonly PropertyKey[], v: ShipmentFormValues): string {
  const [head, index, ...rest] = path.map(String);
  const partialItems = v.items.map((it, i) => ({ it, i })).filter(({ it }) => it.ship === 'some');
  if (head === 'workOrderIds') return index === undefined ? 'items.root' : `items.${index}.workOrderId`;
  if (head === 'partial') {
    const item = index === undefined ? undefined : partialItems[Number(index)];
    return item ? `items.${item.i}.serials` : 'items.root';
  }
  if (head === 'packages' && index === undefined) return 'packages.root';
  if (head === 'shipTo' && index === undefined) return 'shipTo.line1';
  return [head, index, ...rest].filter((p) => p !== undefined).join('.');
}

/** Messages in the user's units: the contract's limits on package sizes are in kg and mm. */
function rewrite(issue: { path: PropertyKey[]; message: string; code: string; maximum?: unknown }, lengthUnit: LengthUnit): string {
  const [head, , field] = issue.path.map(String);
  if (head !== 'packages' || !field) return issue.message;
  const what = field[0].toUpperCase() + field.slice(1);
  if (issue.code === 'invalid_type') return `${what}: enter a number`;
  if (issue.code === 'too_big' && typeof issue.maximum === 'number') {
    const mass = massUnitFor(lengthUnit);
    const max = field === 'weight' ? fromKilograms(issue.maximum, mass) : fromMillimetres(issue.maximum, lengthUnit);
    return `${what}: at most ${Number(max.toFixed(1)).toLocaleString('en-US')} ${field === 'weight' ? mass : lengthUnit}`;
  }
  return issue.message;
}

/** The form's schema: the values go through the contract, and each issue lands on its field. */
export const shipmentFormSchema = (lengthUnit: LengthUnit) =>
  throughContract(
    (v: ShipmentFormValues) => toRequest(v, lengthUnit),
    createShipmentRequest,
    (issue) => rewrite(issue, lengthUnit),
    (path, values) => formPath(path, values).split('.'),
  );

/**
 * The server's `fields` keys → the form's paths (the same rules as the contract's issues). A
 * refused shipment's 422 names each work order and why in `fields.workOrderIds` ("WO-…: why ·
 * WO-…: why"; and machine-readable in `current.workOrders`, which this prefers):
 * each reason goes beside its own work order; only what names none stays above the list.
 */
export function serverFieldsToForm(fields: Record<string, string>, v: ShipmentFormValues, numbers: Map<number, string>, current?: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  const add = (path: string, message: string) => (out[path] = out[path] ? `${out[path]} ${message}` : message);
  const itemOf = (workOrderId: number) => v.items.findIndex((i) => i.workOrderId === workOrderId);
  const named = (current as { workOrders?: { workOrderId: number; reasons: string[] }[] } | undefined)?.workOrders;
  for (const [key, message] of Object.entries(fields)) {
    if (key !== 'workOrderIds') {
      add(formPath(key.split('.'), v), message);
      continue;
    }
    if (Array.isArray(named) && named.every((p) => itemOf(p.workOrderId) >= 0)) {
      for (const p of named) add(`items.${itemOf(p.workOrderId)}.workOrderId`, p.reasons.join('; '));
      continue;
    }
    for (const part of message.split(' · ')) {
      const index = v.items.findIndex((i) => {
        const n = numbers.get(i.workOrderId);
        return n !== undefined && part.startsWith(`${n}: `);
      });
      if (index >= 0) add(`items.${index}.workOrderId`, part.slice(part.indexOf(': ') + 2));
      else add('items.root', part);
    }
  }
  return out;
}
