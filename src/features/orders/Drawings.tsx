/**
 * Drawings and specs: a drop zone that also opens the file picker. The browser checks only the
 * size (for a quick answer); the server decides what a file is by its content and says so.
 */
import { useId, useRef, useState, type DragEvent } from 'react';
import { ATTACHMENT_MAX_BYTES, ATTACHMENT_TYPES } from '../../contracts/orders';
import { Button } from '../../components/Button';
import { formatBytes } from '../../lib/format';

/** What the picker offers; a file of another name may still be sent (the content decides). */
export const ACCEPT = '.pdf,.png,.jpg,.jpeg,.dxf,.step,.stp,application/pdf,image/png,image/jpeg';
export const KINDS = Object.values(ATTACHMENT_TYPES).join(', ');
const MAX_MB = ATTACHMENT_MAX_BYTES / (1024 * 1024);

/** A quick check before sending: too big or empty files are refused here with a plain reason. */
export function precheck(file: File): string | null {
  if (file.size === 0) return `${file.name} is empty.`;
  if (file.size > ATTACHMENT_MAX_BYTES) return `${file.name} is ${formatBytes(file.size)}; files may be up to ${MAX_MB} MB.`;
  return null;
}

export function DropZone({ onFiles, disabled, label = 'Drawings and specifications' }: { onFiles: (files: File[]) => void; disabled?: boolean; label?: string }) {
  const input = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const hintId = useId();
  const take = (list: FileList | null) => {
    const files = list ? Array.from(list) : [];
    if (files.length) onFiles(files);
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    if (!disabled) take(e.dataTransfer.files);
  };
  return (
    <div
      data-testid="drop-zone"
      onDragOver={(e) => {
        e.preventDefault();
        if (!disabled) setOver(true);
      }}
      onDragLeave={() => setOver(false)}
      onDrop={onDrop}
      className={`flex flex-wrap items-center gap-x-4 gap-y-2 rounded-md border-2 border-dashed px-4 py-3 transition-colors ${
        over ? 'border-copper-500 bg-copper-50' : 'border-graphite-300 bg-graphite-50'
      } ${disabled ? 'opacity-60' : ''}`}
    >
      <svg viewBox="0 0 24 24" className="size-7 shrink-0 text-copper-600" aria-hidden>
        <path d="M6 3h8l5 5v13H6z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
        <path d="M14 3v5h5M12.5 18v-6.5m0 0L10 14m2.5-2.5L15 14" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-graphite-900">{over ? 'Drop to add' : `Drop ${label.toLowerCase()} here`}</p>
        <p id={hintId} className="text-sm text-graphite-600">
          {KINDS}; up to {MAX_MB}&nbsp;MB each. The server checks what each file really is.
        </p>
      </div>
      <Button size="sm" className="h-9" disabled={disabled} onClick={() => input.current?.click()} aria-describedby={hintId}>
        Choose files…
      </Button>
      <input
        ref={input}
        type="file"
        multiple
        accept={ACCEPT}
        className="sr-only"
        tabIndex={-1}
        aria-label={`Choose ${label.toLowerCase()}`}
        data-testid="file-input"
        onChange={(e) => {
          take(e.target.files);
          e.target.value = '';
        }}
      />
    </div>
  );
}

export type UploadItem = {
  key: string;
  file: File;
  /** Line index (new order) or line id (saved order); null for the whole order. */
  line: number | null;
  state: 'queued' | 'sending' | 'done' | 'failed';
  progress: number;
  message?: string;
};

let seq = 0;
export const newItem = (file: File, line: number | null = null): UploadItem => ({ key: `u${++seq}`, file, line, state: 'queued', progress: 0 });

/** The queue: each file, where it goes, its progress or the reason it was refused. */
export function UploadList({
  items,
  lineOptions,
  onLine,
  onRemove,
}: {
  items: UploadItem[];
  lineOptions: { value: number; label: string }[];
  onLine?: (key: string, line: number | null) => void;
  onRemove?: (key: string) => void;
}) {
  if (!items.length) return null;
  return (
    <ul className="mt-2 flex flex-col divide-y divide-graphite-100 rounded-md border border-graphite-200 bg-white text-sm" aria-label="Files to upload">
      {items.map((it) => (
        <li key={it.key} className="flex flex-wrap items-center gap-x-3 gap-y-1 px-3 py-1.5" data-upload={it.file.name} data-upload-state={it.state}>
          <span className="min-w-0 flex-1 truncate font-semibold text-graphite-900" title={it.file.name}>
            {it.file.name}
          </span>
          <span className="tabular text-graphite-600">{formatBytes(it.file.size)}</span>
          {onLine && it.state === 'queued' ? (
            <select
              aria-label={`Where ${it.file.name} belongs`}
              value={it.line === null ? '' : String(it.line)}
              onChange={(e) => onLine(it.key, e.target.value === '' ? null : Number(e.target.value))}
              className="h-7 rounded border border-graphite-300 bg-white px-1.5"
            >
              <option value="">Whole order</option>
              {lineOptions.map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
            </select>
          ) : (
            <span className="text-graphite-600">{it.line === null ? 'Whole order' : (lineOptions.find((o) => o.value === it.line)?.label ?? 'A line')}</span>
          )}
          <span className="w-40">
            {it.state === 'sending' && (
              <span className="flex items-center gap-2">
                <progress max={1} value={it.progress} className="h-2 w-24 accent-copper-600" aria-label={`Sending ${it.file.name}`} />
                <span className="tabular text-graphite-600">{Math.round(it.progress * 100)}&nbsp;%</span>
              </span>
            )}
            {it.state === 'queued' && <span className="text-graphite-600">Sent when the order is saved</span>}
            {it.state === 'done' && <span className="font-semibold text-ok">✓ Uploaded</span>}
          </span>
          {onRemove && it.state !== 'sending' && (
            <Button size="sm" variant="quiet" onClick={() => onRemove(it.key)} aria-label={`Remove ${it.file.name}`}>
              Remove
            </Button>
          )}
          {it.state === 'failed' && (
            <p className="w-full text-sm font-medium text-fault" role="alert">
              <span aria-hidden className="mr-1.5 inline-block size-2 rotate-45 bg-fault" />
              Not uploaded: {it.message}
            </p>
          )}
        </li>
      ))}
    </ul>
  );
}
