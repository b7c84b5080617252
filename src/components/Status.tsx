import type { ReactNode } from 'react';

/**
 * A status shown three ways at once — a word, a shape and a colour — so it reads without colour
 * vision and in black-and-white print: good = filled circle, caution = triangle, fault = cross
 * in a square, idle = hollow circle.
 */
export type StatusKind = 'good' | 'caution' | 'fault' | 'idle';

const TONE: Record<StatusKind, string> = {
  good: 'text-ok bg-ok-soft border-ok/30',
  caution: 'text-caution bg-caution-soft border-caution/30',
  fault: 'text-fault bg-fault-soft border-fault/30',
  idle: 'text-graphite-600 bg-graphite-100 border-graphite-300',
};

export function StatusShape({ kind, className = 'size-3.5' }: { kind: StatusKind; className?: string }) {
  return (
    <svg viewBox="0 0 16 16" className={`shrink-0 ${className}`} aria-hidden focusable="false">
      {kind === 'good' && <circle cx="8" cy="8" r="6.5" fill="currentColor" />}
      {kind === 'caution' && <path d="M8 1.5 15 14.5H1z" fill="currentColor" />}
      {kind === 'fault' && (
        <>
          <rect x="1.5" y="1.5" width="13" height="13" rx="1.5" fill="currentColor" />
          <path d="M5 5l6 6M11 5l-6 6" stroke="white" strokeWidth="2" strokeLinecap="round" />
        </>
      )}
      {kind === 'idle' && <circle cx="8" cy="8" r="5.5" fill="none" stroke="currentColor" strokeWidth="2" />}
    </svg>
  );
}

export function StatusBadge({ kind, children }: { kind: StatusKind; children: ReactNode }) {
  return (
    <span className={`inline-flex items-center gap-1.5 rounded border px-2 py-0.5 text-sm font-semibold ${TONE[kind]}`} data-status={kind}>
      <StatusShape kind={kind} />
      {children}
    </span>
  );
}
