import type { ReactNode } from 'react';
import { Link, useLocation } from 'react-router';
import { buttonClass } from '../components/Button';

export function NotFound() {
  const { pathname } = useLocation();
  return (
    <ProblemPage code="404" title="No such page" text={<>There is no page at <code className="rounded bg-graphite-100 px-1.5 py-0.5 font-mono text-sm">{pathname}</code>. It may have moved, or the link has a typo.</>} />
  );
}

export function ProblemPage({ code, title, text }: { code: string; title: string; text: ReactNode }) {
  return (
    <div className="mx-auto mt-10 max-w-xl rounded-lg border border-graphite-200 bg-white p-8">
      <p className="font-mono text-sm font-semibold tracking-widest text-copper-600">{code}</p>
      <h1 className="mt-1 text-2xl font-bold text-graphite-950">{title}</h1>
      <p className="mt-2 text-graphite-700">{text}</p>
      <Link to="/" className={buttonClass('primary', 'md', 'mt-6')}>
        Back to your home
      </Link>
    </div>
  );
}

