/** Building blocks the role homes share. Later features add their own panels to a role's home. */
import type { ReactNode } from 'react';
import type { SessionUser } from '../../contracts/auth';
import { ROLE_LABELS } from '../../contracts/roles';
import { Panel } from '../../components/Panel';
import { StatusShape } from '../../components/Status';
import { UnitPreferences } from '../../components/UnitPreferences';
import { useUnits } from '../../lib/session';
import { ROLE_WORK } from './roleWork';

const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

export function HomeFrame({ user, children }: { user: SessionUser; children: ReactNode }) {
  const work = ROLE_WORK[user.role];
  return (
    <div data-home={user.role} className="flex flex-col gap-5">
      <div className="rounded-lg border border-graphite-200 bg-white px-5 py-4 shadow-[inset_4px_0_0_#b8632e]">
        <p className="text-sm font-bold tracking-wider text-copper-700 uppercase">{work.title}</p>
        <h1 className="mt-0.5 text-3xl font-bold tracking-tight text-graphite-950">Welcome, {firstName(user.name)}</h1>
        <p className="mt-2 max-w-3xl text-[1.05rem] text-graphite-700">{work.summary}</p>
      </div>
      {children}
    </div>
  );
}

export function DutiesPanel({ user, title = 'Your work here' }: { user: SessionUser; title?: string }) {
  return (
    <Panel title={title}>
      <ul className="flex flex-col gap-2">
        {ROLE_WORK[user.role].duties.map((d) => (
          <li key={d} className="flex gap-2.5 text-graphite-800">
            <span aria-hidden className="mt-2 size-2 shrink-0 rounded-sm bg-copper-500" />
            {d}
          </li>
        ))}
      </ul>
    </Panel>
  );
}

/** The person's account and display units, changeable right here. */
export function AccountPanel({ user, large = false }: { user: SessionUser; large?: boolean }) {
  const u = useUnits();
  return (
    <Panel title="Your account and units">
      <dl className="mb-4 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-graphite-500">Signed in as</dt>
        <dd className="font-semibold">{user.email}</dd>
        <dt className="text-graphite-500">Role</dt>
        <dd className="font-semibold">{ROLE_LABELS[user.role]}</dd>
      </dl>
      <UnitPreferences large={large} />
      <p className="mt-3 text-sm text-graphite-600">
        Measurements show in your units everywhere: 25.4 mm reads <span className="font-semibold text-graphite-900">{u.length(0.0254)}</span>, a 20 °C
        reference reads <span className="font-semibold text-graphite-900">{u.temperature(20)}</span>, and a 40 K rise reads{' '}
        <span className="font-semibold text-graphite-900">{u.temperatureDifference(40)}</span>.
      </p>
    </Panel>
  );
}

/** Where the work can hurt someone, the product says so (see the product brief's safety section). */
export function SafetyPanel({ items }: { items: { title: string; text: string }[] }) {
  return (
    <Panel title="Safety on the floor">
      <ul className="flex flex-col gap-3">
        {items.map((i) => (
          <li key={i.title} className="flex gap-3">
            <StatusShape kind="caution" className="mt-0.5 size-5 text-caution" />
            <div>
              <p className="font-semibold text-graphite-900">{i.title}</p>
              <p className="text-graphite-700">{i.text}</p>
            </div>
          </li>
        ))}
      </ul>
      <p className="mt-3 text-sm text-graphite-500">Local codes and your shop’s written procedures come first.</p>
    </Panel>
  );
}

export const SAFETY = {
  hipot: {
    title: 'Hi-pot testing uses lethal voltages',
    text: 'Test only in the interlocked fixture, and only if you are trained for it. Never touch a coil or its leads while the tester is live.',
  },
  hot: {
    title: 'Coils and ovens run hot',
    text: 'A coil fresh from curing or a heat run can burn. Insulation pushed past its thermal class can smoke and catch fire.',
  },
  lifting: {
    title: 'Holding and lifting magnets',
    text: 'A computed pull is never a lifting rating. Lifting use needs the lifting-device standard and a proof test with a safety factor.',
  },
};
