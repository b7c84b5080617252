/**
 * The floor's read cache: the board and the load view change only when a work order changes, and
 * the live feed already says when. Each answer is built once per key (filters, role, and for floor
 * staff the person, whose allowed moves are their own) — its JSON serialised once, gzipped once,
 * its ETag taken once — and kept until the feed announces any change (or the feed's connection
 * drops, or a minute passes: a safety net for changes the feed does not announce, such as a renamed
 * customer). While the feed is not listening nothing is kept, and while a change this process
 * made has not come back through the feed every answer is computed afresh (a person who just
 * moved a card never reads the board from before the move). Concurrent misses of one key share one
 * computation. A request with `If-None-Match` naming the current ETag gets 304; one with
 * `Cache-Control: no-cache` (a hard reload) is computed afresh.
 */
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import type { Request, Response } from 'express';
import { changesInFlight, type FloorFeed } from './feed';

/** The safety net: an entry is computed again after this long even without a change, ms. */
export const CACHE_MAX_AGE_MS = 60_000;
const MAX_ENTRIES = 500;
/** Bodies smaller than this go uncompressed. */
const GZIP_FROM = 1024;

type Entry = { body: Buffer; gzip: Buffer | null; etag: string; at: number };

export function createReadCache(feed: Pick<FloorFeed, 'watch' | 'listening'>) {
  const entries = new Map<string, Entry>();
  const running = new Map<string, Promise<Entry>>();
  let generation = 0;
  let watching = false;
  let stats = { hits: 0, misses: 0, notModified: 0 };

  const forget = () => {
    generation += 1;
    entries.clear();
    running.clear();
  };

  function startWatching() {
    if (watching) return;
    watching = true;
    feed.watch({ message: forget, resync: forget, lost: forget });
  }

  function build(value: unknown): Entry {
    const body = Buffer.from(JSON.stringify(value));
    const etag = `"${createHash('sha1').update(body).digest('base64url')}"`;
    return { body, gzip: body.length >= GZIP_FROM ? gzipSync(body) : null, etag, at: Date.now() };
  }

  async function get(key: string, compute: () => Promise<unknown>, fresh = false): Promise<Entry> {
    startWatching();
    const now = Date.now();
    // A change this process made is still on its way back through the feed: answer afresh.
    if (changesInFlight(now)) fresh = true;
    const hit = entries.get(key);
    if (!fresh && hit && now - hit.at < CACHE_MAX_AGE_MS) {
      stats.hits += 1;
      return hit;
    }
    const inFlight = !fresh && running.get(key);
    if (inFlight) {
      stats.hits += 1;
      return inFlight;
    }
    stats.misses += 1;
    const gen = generation;
    const p = compute().then(build);
    running.set(key, p);
    try {
      const entry = await p;
      // Kept only when nothing changed while it was computed and the feed is there to say when it does.
      if (gen === generation && feed.listening && !changesInFlight()) {
        if (entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
        entries.set(key, entry);
      }
      return entry;
    } finally {
      if (running.get(key) === p) running.delete(key);
    }
  }

  /** Answers a GET from the cache: 304 when the client holds this ETag, else the body (gzipped when it may). */
  async function send(req: Request, res: Response, key: string, compute: () => Promise<unknown>) {
    const fresh = /\bno-cache\b/.test(req.get('cache-control') ?? '');
    const e = await get(key, compute, fresh);
    res.set({ ETag: e.etag, 'Cache-Control': 'private, no-cache', Vary: 'Accept-Encoding' });
    const held = req.get('if-none-match');
    if (held && held.split(',').some((t) => t.trim().replace(/^W\//, '') === e.etag)) {
      stats.notModified += 1;
      res.status(304).end();
      return;
    }
    res.type('application/json; charset=utf-8');
    if (e.gzip && req.acceptsEncodings('gzip') === 'gzip') {
      res.set('Content-Encoding', 'gzip');
      res.end(e.gzip);
    } else {
      res.end(e.body);
    }
  }

  return {
    get,
    send,
    /** Drops everything (a change this process made and does not want to wait for the feed on). */
    forget,
    get stats() {
      return { ...stats, entries: entries.size };
    },
    resetStats() {
      stats = { hits: 0, misses: 0, notModified: 0 };
    },
  };
}
export type ReadCache = ReturnType<typeof createReadCache>;
