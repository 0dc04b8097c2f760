/**
 * "Record a finding", fetched when it is first opened: the form library it uses is the runner's
 * second-largest dependency and most steps never record a finding.
 */
import { lazy, Suspense, type ComponentProps } from 'react';

const FindingForm = lazy(() => import('./FindingForm'));

export function LazyFindingForm(props: ComponentProps<typeof FindingForm>) {
  return (
    <Suspense fallback={<p className="text-muted min-h-12 flex items-center gap-2" role="status" data-testid="finding-form-loading"><span aria-hidden="true">◌</span> Opening the finding form…</p>}>
      <FindingForm {...props} />
    </Suspense>
  );
}
