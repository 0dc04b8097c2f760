/** The one place an island reports errors and outcomes: announced to screen readers, never alert(). */
export type Status = { kind: 'error' | 'ok' | 'info'; message: string } | null;

export function StatusRegion({ status }: { status: Status }) {
  return (
    <div role="status" aria-live="polite" className="min-h-0">
      {status && (
        <p className="tt-status rounded-md px-4 py-3 my-3" data-kind={status.kind} data-testid="status">
          {status.message}
        </p>
      )}
    </div>
  );
}
