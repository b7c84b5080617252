import { Fragment } from 'react';

/** Serial numbers of units, shown compactly: the first few, the rest behind "+n more". */
export function Serials({ serials, show = 6 }: { serials: string[]; show?: number }) {
  if (!serials.length) return <span className="text-graphite-500">—</span>;
  const head = serials.slice(0, show);
  const rest = serials.slice(show);
  return (
    <span className="text-sm text-graphite-800" data-serials={serials.length}>
      <span className="tabular">
        {head.map((x, i) => (
          // A serial never breaks at its hyphens; the line breaks between serials.
          <Fragment key={x}>
            <span className="whitespace-nowrap">{x}</span>
            {i < head.length - 1 ? ', ' : ''}
          </Fragment>
        ))}
      </span>
      {rest.length > 0 && (
        <details className="inline">
          <summary className="ml-1 inline cursor-pointer font-semibold text-copper-700">+{rest.length} more</summary>
          <span className="tabular block">{rest.join(', ')}</span>
        </details>
      )}
    </span>
  );
}

