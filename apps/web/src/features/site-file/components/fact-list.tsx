import type { ReactNode } from 'react';

/** A compact definition list of label → value pairs. */
export function FactList({ facts, className }: { facts: readonly [string, ReactNode][]; className?: string }) {
  return (
    <dl className={`fact-grid${className ? ` ${className}` : ''}`}>
      {facts.map(([label, value]) => (
        <div key={label}>
          <dt>{label}</dt>
          <dd>{value}</dd>
        </div>
      ))}
    </dl>
  );
}
