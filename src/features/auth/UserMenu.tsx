import { useEffect, useId, useRef, useState } from 'react';
import { useNavigate } from 'react-router';
import { ROLE_LABELS } from '../../contracts/roles';
import { Button } from '../../components/Button';
import { UnitPreferences } from '../../components/UnitPreferences';
import { useCurrentUser } from '../../lib/session';
import { useSignOut } from './api';

function initials(name: string) {
  return name
    .split(/[\s-]+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((p) => p[0]?.toUpperCase())
    .join('');
}

/** The signed-in person: name and role, display units, sign-out. */
export function UserMenu({ touch = false }: { touch?: boolean }) {
  const user = useCurrentUser();
  const [open, setOpen] = useState(false);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const box = useRef<HTMLDivElement>(null);
  const panelId = useId();

  useEffect(() => {
    if (!open) return;
    const onDown = (e: MouseEvent) => {
      if (box.current && !box.current.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && setOpen(false);
    document.addEventListener('mousedown', onDown);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('mousedown', onDown);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  return (
    <div className="relative" ref={box} data-user-menu>
      <button
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        onClick={() => setOpen((o) => !o)}
        className={`flex items-center gap-2 rounded-md px-2 ${touch ? 'h-12' : 'h-10'} text-left hover:bg-graphite-800`}
      >
        <span aria-hidden className="flex size-8 items-center justify-center rounded-full bg-copper-600 text-sm font-bold text-white">
          {initials(user.name)}
        </span>
        <span className="flex flex-col leading-tight">
          <span className="font-semibold text-white">{user.name}</span>
          <span className="text-xs text-graphite-300">{ROLE_LABELS[user.role]}</span>
        </span>
        <svg viewBox="0 0 12 12" className="size-3 text-graphite-400" aria-hidden>
          <path d="M2 4l4 4 4-4" fill="none" stroke="currentColor" strokeWidth="1.8" />
        </svg>
        <span className="sr-only">Account menu</span>
      </button>
      {open && (
        <div
          id={panelId}
          role="group"
          aria-label="Account"
          className="absolute right-0 z-40 mt-2 w-80 rounded-lg border border-graphite-200 bg-white p-4 text-graphite-900 shadow-xl"
        >
          <p className="font-semibold">{user.name}</p>
          <p className="text-sm text-graphite-600">{user.email}</p>
          <p className="mt-1 text-sm">
            Role: <span className="font-semibold">{ROLE_LABELS[user.role]}</span>
          </p>
          <hr className="my-3 border-graphite-200" />
          <p className="mb-2 text-sm font-bold tracking-wide text-graphite-500 uppercase">Display units</p>
          <UnitPreferences large={touch} />
          <hr className="my-3 border-graphite-200" />
          <Button
            className="w-full"
            size={touch ? 'lg' : 'md'}
            busy={signOut.isPending}
            onClick={() => signOut.mutate(undefined, { onSettled: () => navigate('/sign-in', { replace: true }) })}
          >
            Sign out
          </Button>
        </div>
      )}
    </div>
  );
}
