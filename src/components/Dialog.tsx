import { useEffect, useId, useRef, type ReactNode } from 'react';

/**
 * A modal dialog on the native <dialog> element (focus trap, Esc to close, backdrop).
 * Open it by rendering it with `open`; `onClose` runs on Esc, the close button or a backdrop click.
 */
export function Dialog({ open, title, onClose, children, wide }: { open: boolean; title: ReactNode; onClose: () => void; children: ReactNode; wide?: boolean }) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      onClick={(e) => {
        if (e.target === ref.current) onClose();
      }}
      className={`m-auto w-[calc(100%-2rem)] ${wide ? 'max-w-2xl' : 'max-w-md'} rounded-lg border border-graphite-300 bg-white p-0 text-graphite-900 shadow-xl`}
    >
      {open && (
        <div className="flex flex-col">
          <header className="flex items-center justify-between border-b border-graphite-200 px-5 py-3">
            <h2 id={titleId} className="text-lg font-semibold">
              {title}
            </h2>
            <button type="button" onClick={onClose} className="rounded p-1 text-graphite-500 hover:bg-graphite-100 hover:text-graphite-900" aria-label="Close">
              <svg viewBox="0 0 16 16" className="size-4" aria-hidden>
                <path d="M3 3l10 10M13 3 3 13" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              </svg>
            </button>
          </header>
          <div className="px-5 py-4">{children}</div>
        </div>
      )}
    </dialog>
  );
}
