import type { ReactNode } from 'react';

/**
 * A white panel with a heading: the sections of Tune, Review, Handoff and Team. `aside` sits at
 * the heading's right (a count, a link); `divided` draws a rule under the heading for panels
 * whose body has its own padding.
 */
export function Card({
  title,
  aside,
  children,
  className = '',
  headingLevel = 2,
  testId,
}: {
  title?: ReactNode;
  aside?: ReactNode;
  children: ReactNode;
  className?: string;
  headingLevel?: 2 | 3;
  testId?: string;
}) {
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section className={`card p-4 ${className}`} aria-label={typeof title === 'string' ? title : undefined} data-testid={testId}>
      {title !== undefined && (
        <div className="mb-3 flex items-baseline justify-between gap-2">
          <Heading className="text-sm font-semibold text-slate-800">{title}</Heading>
          {aside}
        </div>
      )}
      {children}
    </section>
  );
}
