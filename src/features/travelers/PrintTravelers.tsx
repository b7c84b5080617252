import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import type { TravelerBatchRequest } from '../../contracts/travelers';
import { Alert } from '../../components/Alert';
import { Button, buttonClass } from '../../components/Button';
import { errorMessage } from '../../lib/api';
import { batchResult, jobQuery, usePrintBatch } from './api';

/** The bar and words of a running print job. */
function JobProgress({ jobId, onDone }: { jobId: string; onDone?: () => void }) {
  const { data, error } = useQuery(jobQuery(jobId));
  if (error) return <Alert title="Cannot follow the print job">{errorMessage(error)}</Alert>;
  const progress = data?.progress ?? 0;
  const state = data?.state ?? 'waiting';
  const result = state === 'completed' ? batchResult(data?.result) : null;
  if (state === 'completed' && onDone) queueMicrotask(onDone);
  return (
    <div className="space-y-2" data-testid="print-progress" data-state={state}>
      <div className="flex items-center justify-between text-sm text-graphite-700">
        <span>
          {state === 'waiting' && 'Waiting for a printer worker…'}
          {state === 'active' && `Drawing travelers… ${progress} %`}
          {state === 'completed' && 'Travelers ready'}
          {state === 'failed' && 'Printing failed'}
        </span>
        <span className="tabular-nums">{progress} %</span>
      </div>
      <div
        className="h-3 w-full overflow-hidden rounded bg-graphite-100"
        role="progressbar"
        aria-label="Printing travelers"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={progress}
      >
        <div className={`h-full ${state === 'failed' ? 'bg-fault' : 'bg-copper-600'} transition-[width]`} style={{ width: `${progress}%` }} />
      </div>
      {state === 'failed' && <Alert title="The print job failed">{data?.error ?? 'No reason given'}. An admin can retry it from the outbox screen.</Alert>}
      {result?.success && (
        <a className={buttonClass('primary')} href={result.data.downloadUrl} target="_blank" rel="noreferrer">
          Open the PDF ({result.data.count} traveler{result.data.count === 1 ? '' : 's'}, {result.data.pages} pages)
        </a>
      )}
    </div>
  );
}

/** Prints a whole order's travelers, or a selection of work orders, as one PDF, with progress. */
export function PrintTravelers({ request, label = 'Print travelers' }: { request: TravelerBatchRequest; label?: string }) {
  const print = usePrintBatch();
  const [jobId, setJobId] = useState<string | null>(null);
  return (
    <div className="space-y-3">
      <Button
        variant="secondary"
        busy={print.isPending}
        onClick={() => print.mutate(request, { onSuccess: (r) => setJobId(r.jobId) })}
      >
        {label}
      </Button>
      {print.error && <Alert title="Cannot print">{errorMessage(print.error)}</Alert>}
      {jobId && <JobProgress key={jobId} jobId={jobId} />}
    </div>
  );
}
