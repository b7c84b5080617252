import type { ReactNode } from 'react';
import { StatusShape, type StatusKind } from './Status';

const TONE: Record<StatusKind, string> = {
  good: 'border-ok/40 bg-ok-soft text-ok',
  caution: 'border-caution/40 bg-caution-soft text-caution',
  fault: 'border-fault/40 bg-fault-soft text-fault',
  idle: 'border-graphite-300 bg-graphite-100 text-graphite-700',
};

/** A message box: shape + title + text. Faults are announced to screen readers at once. */
export function Alert({ kind = 'fault', title, children }: { kind?: StatusKind; title?: ReactNode; children?: ReactNode }) {
  return (
    <div role={kind === 'fault' ? 'alert' : 'status'} className={`flex gap-2.5 rounded-md border px-3 py-2.5 ${TONE[kind]}`}>
      <StatusShape kind={kind} className="mt-0.5 size-4" />
      <div className="text-[0.95rem]">
        {title && <p className="font-semibold">{title}</p>}
        {children && <div className="text-graphite-800">{children}</div>}
      </div>
    </div>
  );
}

/** A form's problems that belong to no one field: the first as the title, the rest listed. */
export function FormProblems({ messages }: { messages: string[] }) {
  if (!messages.length) return null;
  return (
    <Alert kind="fault" title={messages[0]}>
      {messages.length > 1 && (
        <ul className="list-disc pl-4">
          {messages.slice(1).map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
    </Alert>
  );
}
