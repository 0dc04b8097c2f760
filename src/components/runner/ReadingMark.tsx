/** A reading's verdict as shape + word: in spec, out of spec (low/high), not read. */
export function ReadingMark({ inSpec, side }: { inSpec: boolean | null; side?: string | undefined }) {
  if (inSpec === null)
    return (
      <span className="inline-flex items-center gap-1.5 text-muted font-semibold" data-verdict="none">
        <svg width="20" height="20" viewBox="0 0 24 24" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2.2" strokeDasharray="3 3"><circle cx="12" cy="12" r="8.5" /></svg>
        Not read
      </span>
    );
  if (inSpec)
    return (
      <span className="inline-flex items-center gap-1.5 text-ok font-semibold" data-verdict="in">
        <svg width="20" height="20" viewBox="0 0 24 24" aria-hidden="true"><circle cx="12" cy="12" r="10" fill="currentColor" /><path d="M7 12.5l3.2 3.2L17 9" fill="none" stroke="var(--color-surface)" strokeWidth="2.6" strokeLinecap="round" /></svg>
        In spec
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1.5 text-danger font-semibold" data-verdict="out">
      <svg width="20" height="20" viewBox="0 0 24 24" aria-hidden="true"><path d="M8 2h8l6 6v8l-6 6H8l-6-6V8z" fill="currentColor" /><path d="M8.5 8.5l7 7M15.5 8.5l-7 7" stroke="var(--color-surface)" strokeWidth="2.6" strokeLinecap="round" /></svg>
      Out of spec{side && side !== 'ok' ? ` (${side})` : ''}
    </span>
  );
}
