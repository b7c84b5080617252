import type { SessionUser } from '../../src/contracts/auth';
import type { WireSize } from '../../src/contracts/stock';
import type { ListSpoolsQuery, ReceiveSpoolRequest, SpoolRecord, StockCheck } from '../../src/contracts/stock';
import type { Db, Tx } from '../db/client';
import { notFound } from '../http/errors';
import * as repo from './repository';

/** Masses below a milligram are rounding noise. */
const EPS = 1e-6;

export function wireOf(s: repo.SpoolRow): WireSize {
  return s.wireStandard === 'AWG' ? { standard: 'AWG', gauge: s.awgGauge! } : { standard: 'metric', diameter: s.diameter! };
}

const freeOf = (netMass: number, reserved: number) => Math.max(0, netMass - reserved);

function toRecord(r: { spool: repo.SpoolRow; reserved: number; receiverName: string | null }): SpoolRecord {
  const s = r.spool;
  return {
    id: s.id,
    conductor: s.conductor,
    wire: wireOf(s),
    insulationGrade: s.insulationGrade,
    supplier: s.supplier,
    lot: s.lot,
    netMass: s.netMass,
    reservedMass: r.reserved,
    freeMass: freeOf(s.netMass, r.reserved),
    location: s.location,
    receivedAt: s.receivedAt.toISOString(),
    receivedBy: s.receivedBy !== null && r.receiverName ? { id: s.receivedBy, name: r.receiverName } : null,
  };
}

export async function listSpools(db: Db | Tx, q: Partial<ListSpoolsQuery> = {}): Promise<SpoolRecord[]> {
  return (await repo.listSpools(db, q)).map(toRecord);
}

/** Receives a spool into stock. */
export async function receiveSpool(db: Db | Tx, input: ReceiveSpoolRequest, actor: SessionUser): Promise<SpoolRecord> {
  const row = await repo.insertSpool(db, {
    conductor: input.conductor,
    wireStandard: input.wire.standard,
    awgGauge: input.wire.standard === 'AWG' ? input.wire.gauge : null,
    diameter: input.wire.standard === 'metric' ? input.wire.diameter : null,
    insulationGrade: input.insulationGrade,
    supplier: input.supplier,
    lot: input.lot,
    netMass: input.netMass,
    location: input.location,
    receivedAt: input.receivedAt ? new Date(input.receivedAt) : new Date(),
    receivedBy: actor.id,
  });
  const found = await repo.findSpool(db, row.id);
  if (!found) throw notFound('No such spool');
  return toRecord(found);
}

export type FreeSpool = { id: number; supplier: string; lot: string; location: string; receivedAt: string; free: number };

/** Free mass on the spools of a wire, oldest lot first. Inside a release, lock them first (repo.lockSpools). */
export async function freeSpools(db: Db | Tx, key: repo.WireKey): Promise<FreeSpool[]> {
  const rows = await repo.spoolsOfWire(db, key);
  return rows
    .map(({ spool: s, reserved }) => ({
      id: s.id,
      supplier: s.supplier,
      lot: s.lot,
      location: s.location,
      receivedAt: s.receivedAt.toISOString(),
      free: freeOf(s.netMass, reserved),
    }))
    .filter((s) => s.free > EPS);
}

/**
 * Takes `need` kg from the spools in their order (oldest lot first), splitting across spools;
 * lowers each spool's free mass. Returns what was taken from which spool (less than `need`
 * when the spools run out).
 */
export function allocate(spools: FreeSpool[], need: number): { spoolId: number; mass: number }[] {
  const out: { spoolId: number; mass: number }[] = [];
  let left = need;
  for (const s of spools) {
    if (left <= EPS) break;
    if (s.free <= EPS) continue;
    const take = Math.min(s.free, left);
    s.free -= take;
    left -= take;
    out.push({ spoolId: s.id, mass: take });
  }
  return out;
}

/** Wire a number of units needs with the scrap allowance: mass per unit × units × (1 + allowance). */
export const wireNeeded = (massPerUnit: number, units: number, scrapAllowancePercent: number) =>
  massPerUnit * units * (1 + scrapAllowancePercent / 100);

/**
 * What `quantity` units of a wire need against the free stock, and which spools a release takes
 * from. Pure over the free spools given.
 */
export function stockCheckOf(
  key: repo.WireKey,
  spools: FreeSpool[],
  quantity: number,
  massPerUnit: number,
  scrapAllowancePercent: number,
): StockCheck {
  const needed = wireNeeded(massPerUnit, quantity, scrapAllowancePercent);
  const available = spools.reduce((a, s) => a + s.free, 0);
  const copy = spools.map((s) => ({ ...s }));
  const takes = new Map(allocate(copy, needed).map((t) => [t.spoolId, t.mass]));
  const short = available + EPS < needed;
  return {
    conductor: key.conductor,
    wire: key.wire,
    insulationGrade: key.insulationGrade,
    quantity,
    massPerUnit,
    scrapAllowancePercent,
    needed,
    available,
    short,
    shortfall: short ? needed - available : 0,
    spools: spools.map((s) => ({
      id: s.id,
      supplier: s.supplier,
      lot: s.lot,
      location: s.location,
      receivedAt: s.receivedAt,
      freeMass: s.free,
      take: takes.get(s.id) ?? 0,
    })),
  };
}
