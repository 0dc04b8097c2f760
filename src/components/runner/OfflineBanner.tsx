/** Connection and outbox at a glance: offline with events waiting, or sending them. Icon + word, never colour alone. */
export function OfflineBanner({ online, waiting, sending }: { online: boolean; waiting: number; sending: boolean }) {
  if (online && waiting === 0) return null;
  const events = `${waiting} ${waiting === 1 ? 'event' : 'events'}`;
  const text = !online
    ? `Offline — ${waiting > 0 ? `${events} waiting to send` : 'entries are kept on this device and sent when the connection returns'}`
    : `Online — ${sending ? 'sending' : 'waiting to send'} ${events}`;
  return (
    <div role="status" aria-live="polite" data-testid="connection-banner" data-online={online} className={`flex items-center gap-3 rounded-md px-4 py-3 mb-4 font-semibold border-l-8 ${online ? 'bg-accent-soft border-accent' : 'bg-warn-soft border-warn'}`}>
      <svg width="26" height="26" viewBox="0 0 24 24" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round">
        {online ? (
          <path d="M4 12a8 8 0 0 1 13.7-5.6M20 12a8 8 0 0 1-13.7 5.6M17 3v4h-4M7 21v-4h4" />
        ) : (
          <>
            <path d="M2 8.5a15 15 0 0 1 20 0M5.5 12a10 10 0 0 1 13 0M9 15.5a5 5 0 0 1 6 0" />
            <circle cx="12" cy="19" r="1.2" fill="currentColor" />
            <path d="M3 3l18 18" />
          </>
        )}
      </svg>
      <span>{text}</span>
    </div>
  );
}
