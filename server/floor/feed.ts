/**
 * The floor's live feed. A change to a work order (move, assignment, priority) calls
 * `notifyFloor` inside its own transaction: PostgreSQL delivers the NOTIFY only if the
 * transaction commits, to every API process listening. Each process holds one dedicated
 * connection that LISTENs (opened when its first board or its read cache needs it, closed when
 * the last one leaves) and fans the messages out to its server-sent-event streams and watchers.
 * A stream may enrich each message for its user (the board sends the changed card, so an open
 * board updates without fetching its lists again).
 */
import { sql } from 'drizzle-orm';
import pg from 'pg';
import type { Request, Response } from 'express';
import type { SessionUser } from '../../src/contracts/auth';
import { FLOOR_EVENT_NAME, type FloorChange } from '../../src/contracts/floor';
import type { Tx } from '../db/client';
import { HttpError } from '../http/errors';

export const FLOOR_CHANNEL = 'floor_changes';
/** A comment line this often keeps proxies and the browser from closing an idle stream. */
export const HEARTBEAT_MS = 25_000;
const RECONNECT_MS = 2_000;

/**
 * Changes this process announced whose NOTIFY has not come back yet (payload → expiry, ms). Until
 * it does, this process's read cache neither serves nor keeps answers, so a person who changed
 * something and reads at once never gets the board from before the change. A rolled-back change
 * never comes back: its entry expires.
 */
const inFlight = new Map<string, number>();
const IN_FLIGHT_MS = 3_000;

/** Has this process announced a change it has not yet heard back? */
export function changesInFlight(now = Date.now()): boolean {
  for (const [payload, until] of inFlight) if (until <= now) inFlight.delete(payload);
  return inFlight.size > 0;
}

export async function notifyFloor(tx: Tx, change: FloorChange) {
  const payload = JSON.stringify(change);
  inFlight.set(payload, Date.now() + IN_FLIGHT_MS);
  await tx.execute(sql`select pg_notify(${FLOOR_CHANNEL}, ${payload})`);
}

type Subscriber = { message(payload: string): void; resync(): void; lost?(): void };

/** Turns one change into what a user's stream carries (the default: the change as it came). */
export type Enrich = (change: FloorChange, user: SessionUser) => Promise<unknown>;

/** One LISTEN connection per process, shared by every stream it serves. */
export function createFloorFeed(databaseUrl: string, enrich?: Enrich) {
  const subscribers = new Set<Subscriber>();
  let client: pg.Client | null = null;
  let connecting: Promise<void> | null = null;
  let retry: NodeJS.Timeout | null = null;

  /** Subscribers still here: reconnect, then tell them to refetch (they may have missed changes). */
  function reconnectLater() {
    if (subscribers.size && !retry) {
      retry = setTimeout(() => {
        retry = null;
        if (subscribers.size) connect().then(() => subscribers.forEach((s) => s.resync()), reconnectLater);
      }, RECONNECT_MS);
    }
  }

  function drop(c: pg.Client) {
    if (client === c) client = null;
    c.removeAllListeners('notification');
    c.on('error', () => {});
    c.end().catch(() => {});
  }

  function connect(): Promise<void> {
    if (client) return Promise.resolve();
    connecting ??= (async () => {
      const c = new pg.Client({ connectionString: databaseUrl, connectionTimeoutMillis: 5_000 });
      const lost = () => {
        const was = client === c;
        drop(c);
        if (was) subscribers.forEach((s) => s.lost?.());
        reconnectLater();
      };
      c.on('error', lost);
      c.on('end', lost);
      c.on('notification', (m) => {
        if (m.channel !== FLOOR_CHANNEL || !m.payload) return;
        inFlight.delete(m.payload);
        for (const s of subscribers) s.message(m.payload);
      });
      try {
        await c.connect();
        await c.query(`LISTEN ${FLOOR_CHANNEL}`);
        // The listening socket alone never keeps a process alive (the HTTP server does that).
        (c as unknown as { connection?: { stream?: { unref?: () => void } } }).connection?.stream?.unref?.();
      } catch (e) {
        drop(c);
        throw e;
      }
      client = c;
    })().finally(() => {
      connecting = null;
    });
    return connecting;
  }

  function release(s: Subscriber) {
    subscribers.delete(s);
    if (subscribers.size === 0) {
      if (retry) clearTimeout(retry);
      retry = null;
      if (client) drop(client);
    }
  }

  return {
    /** Resolves once this process is listening; the returned function unsubscribes. */
    async subscribe(s: Subscriber): Promise<() => void> {
      subscribers.add(s);
      try {
        await connect();
      } catch {
        release(s);
        throw new HttpError(503, 'unavailable', 'The live feed is unavailable; the board can still be refreshed');
      }
      return () => release(s);
    },
    /**
     * Hears every change from now on, across lost connections (reconnecting by itself), until the
     * returned function is called. `lost` is told when the connection drops (changes may be missed
     * until `resync`).
     */
    watch(s: Subscriber): () => void {
      subscribers.add(s);
      connect().catch(() => {
        s.lost?.();
        reconnectLater();
      });
      return () => release(s);
    },
    /** Streams the feed to one client until it disconnects. */
    async stream(req: Request, res: Response, user?: SessionUser) {
      let open = false;
      let closed = false;
      let unsubscribe = () => {};
      let beat: NodeJS.Timeout | undefined;
      const send = (chunk: string) => {
        if (open && !res.writableEnded) res.write(chunk);
      };
      // Attached first: a client gone while we connect is cleaned up too.
      res.on('close', () => {
        closed = true;
        open = false;
        clearInterval(beat);
        unsubscribe();
      });
      const message = (payload: string) => {
        if (!enrich || !user) return send(`event: ${FLOOR_EVENT_NAME}\ndata: ${payload}\n\n`);
        let change: FloorChange;
        try {
          change = JSON.parse(payload) as FloorChange;
        } catch {
          return;
        }
        enrich(change, user).then(
          (data) => send(`event: ${FLOOR_EVENT_NAME}\ndata: ${JSON.stringify(data)}\n\n`),
          // Could not read the card: the change alone (the board fetches what it needs).
          () => send(`event: ${FLOOR_EVENT_NAME}\ndata: ${payload}\n\n`),
        );
      };
      unsubscribe = await this.subscribe({
        message,
        resync: () => send('event: ready\ndata: {}\n\n'),
      });
      if (closed) return unsubscribe();
      res.writeHead(200, {
        'Content-Type': 'text/event-stream; charset=utf-8',
        'Cache-Control': 'no-cache, no-transform',
        Connection: 'keep-alive',
        'X-Accel-Buffering': 'no',
      });
      open = true;
      res.write('retry: 3000\n\n');
      send('event: ready\ndata: {}\n\n');
      beat = setInterval(() => send(': heartbeat\n\n'), HEARTBEAT_MS);
      req.socket.setKeepAlive(true);
    },
    get listening() {
      return client !== null;
    },
  };
}
export type FloorFeed = ReturnType<typeof createFloorFeed>;
