import type { LineFacts } from '../contracts/shipments';

/** An order line as shipping names it: "2. Valve coil 12 V DC" with the customer's part number under it. */
export function LineName({ line }: { line: Pick<LineFacts, 'lineNo' | 'lineTitle' | 'customerPartNumber'> }) {
  return (
    <>
      <span className="text-graphite-500">{line.lineNo}.</span> {line.lineTitle}
      {line.customerPartNumber && <span className="block text-xs whitespace-nowrap text-graphite-600">part {line.customerPartNumber}</span>}
    </>
  );
}
