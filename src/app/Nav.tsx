import { useEffect, useId, useRef, useState } from 'react';
import { NavLink, useLocation } from 'react-router';
import type { Role } from '../contracts/roles';
import { NAV_GROUP_LABELS, navFor, type NavGroup, type Screen } from './screens';

/** Up to this many entries the navigation is one flat row; beyond it, screens gather under their group. */
const FLAT_MAX = 7;

type Entry = { kind: 'link'; screen: Screen } | { kind: 'group'; group: NavGroup; screens: Screen[] };

/** The role's navigation: flat when short, else one entry per group (a group of one stays a link). */
export function navEntries(role: Role): Entry[] {
  const items = navFor(role);
  if (items.length <= FLAT_MAX) return items.map((screen) => ({ kind: 'link', screen }));
  const entries: Entry[] = [];
  for (const s of items) {
    if (!s.group) {
      entries.push({ kind: 'link', screen: s });
      continue;
    }
    const existing = entries.find((e): e is Extract<Entry, { kind: 'group' }> => e.kind === 'group' && e.group === s.group);
    if (existing) existing.screens.push(s);
    else entries.push({ kind: 'group', group: s.group, screens: [s] });
  }
  return entries.map((e) => (e.kind === 'group' && e.screens.length === 1 ? { kind: 'link', screen: e.screens[0]! } : e));
}

const itemClass = (active: boolean, touch: boolean) =>
  `flex items-center gap-1.5 rounded-md px-3 ${touch ? 'h-12 text-lg' : 'h-9'} font-semibold transition-colors ${
    active ? 'bg-graphite-700 text-white shadow-[inset_0_-3px_0_#cf7d47]' : 'text-graphite-200 hover:bg-graphite-800 hover:text-white'
  }`;

/** Whether the current path is this screen's (or below it). */
function isActive(pathname: string, s: Screen): boolean {
  if (s.path === '/') return pathname === '/';
  return pathname === s.path || pathname.startsWith(`${s.path}/`);
}

export function MainNav({ role, touch }: { role: Role; touch: boolean }) {
  const entries = navEntries(role);
  return (
    <nav aria-label="Main" className="flex flex-1 flex-wrap items-center gap-1">
      {entries.map((e) =>
        e.kind === 'link' ? (
          <NavLink key={e.screen.id} to={e.screen.path} end={e.screen.path === '/'} className={({ isActive: a }) => itemClass(a, touch)}>
            {e.screen.label}
          </NavLink>
        ) : (
          <GroupMenu key={e.group} label={NAV_GROUP_LABELS[e.group]} screens={e.screens} touch={touch} />
        ),
      )}
    </nav>
  );
}

/** A group's button and its list of screens; closes on a choice, Escape, or a click elsewhere. */
function GroupMenu({ label, screens, touch }: { label: string; screens: Screen[]; touch: boolean }) {
  const { pathname } = useLocation();
  const [open, setOpen] = useState(false);
  const box = useRef<HTMLDivElement>(null);
  const listId = useId();
  const active = screens.some((s) => isActive(pathname, s));

  useEffect(() => setOpen(false), [pathname]);
  useEffect(() => {
    if (!open) return;
    const onDown = (ev: PointerEvent) => {
      if (!box.current?.contains(ev.target as Node)) setOpen(false);
    };
    const onKey = (ev: KeyboardEvent) => {
      if (ev.key === 'Escape') setOpen(false);
    };
    document.addEventListener('pointerdown', onDown);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('pointerdown', onDown);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  return (
    <div ref={box} className="relative" data-nav-group={label}>
      <button type="button" aria-expanded={open} aria-controls={listId} onClick={() => setOpen((o) => !o)} className={itemClass(active, touch)}>
        {label}
        <svg aria-hidden viewBox="0 0 12 12" className={`size-3 transition-transform ${open ? 'rotate-180' : ''}`}>
          <path d="M2 4.5 6 8.5l4-4" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      </button>
      {open && (
        <ul id={listId} className="absolute left-0 z-40 mt-1 min-w-48 rounded-md border border-graphite-700 bg-graphite-900 p-1 shadow-lg">
          {screens.map((s) => (
            <li key={s.id}>
              <NavLink to={s.path} end className={({ isActive: a }) => `${itemClass(a, touch)} w-full whitespace-nowrap`}>
                {s.label}
              </NavLink>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
