/**
 * The floor's live feed. A change to a work order (move, assignment, priority) calls
 * `notifyFloor` inside its own transaction: PostgreSQL delivers the NOTIFY only if the
 * transaction commits, to every API process listening. Each process holds one dedicated
 * connection that LISTENs (opened when its first board connects, closed when the last one
 * leaves) and fans the messages out to its server-sent-event streams.
 */
import { sql } from 'drizzle-orm';
import pg from 'pg';
import type { Request, Response } from 'express';
import { FLOOR_EVENT_NAME, type FloorChange } from '../../src/contracts/floor';
import type { Tx } from '../db/client';
import { HttpError } from '../http/errors';

export const FLOOR_CHANNEL = 'floor_changes';
/** A comment line this often keeps proxies and the browser from closing an idle stream. */
export const HEARTBEAT_MS = 25_000;
const RECONNECT_MS = 2_000;

export async function notifyFloor(tx: Tx, change: FloorChange) {
  await tx.execute(sql`select pg_notify(${FLOOR_CHANNEL}, ${JSON.stringify(change)})`);
}

type Subscriber = { message(payload: string): void; resync(): void };

/** One LISTEN connection per process, shared by every stream it serves. */
export function createFloorFeed(databaseUrl: string) {
  const subscribers = new Set<Subscriber>();
  let client: pg.Client | null = null;
  let connecting: Promise<void> | null = null;
  let retry: NodeJS.Timeout | null = null;

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
        drop(c);
        // Boards still open: reconnect, then tell them to refetch (they may have missed changes).
        if (subscribers.size && !retry) {
          retry = setTimeout(() => {
            retry = null;
            if (subscribers.size) connect().then(() => subscribers.forEach((s) => s.resync()), lost);
          }, RECONNECT_MS);
        }
      };
      c.on('error', lost);
      c.on('end', lost);
      c.on('notification', (m) => {
        if (m.channel === FLOOR_CHANNEL && m.payload) for (const s of subscribers) s.message(m.payload);
      });
      try {
        await c.connect();
        await c.query(`LISTEN ${FLOOR_CHANNEL}`);
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
    /** Streams the feed to one client until it disconnects. */
    async stream(req: Request, res: Response) {
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
      unsubscribe = await this.subscribe({
        message: (payload) => send(`event: ${FLOOR_EVENT_NAME}\ndata: ${payload}\n\n`),
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
