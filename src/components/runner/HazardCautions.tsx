/** The usual cautions for a step's hazards, always with the sentence that defers to the maker. */
import type { Hazard } from '../../domain/procedure/schema';
import { DEFER_TO_MAKER, HAZARD_CAUTIONS } from './hazard-words';

export function HazardCautions({ hazards }: { hazards: readonly Hazard[] }) {
  return (
    <div className="rounded-md border-l-8 border-warn bg-warn-soft px-4 py-3 space-y-2" data-testid="hazard-cautions">
      {hazards.length > 0 && (
        <ul className="space-y-1">
          {hazards.map((h) => (
            <li key={h} className="flex gap-2">
              <svg width="24" height="24" viewBox="0 0 24 24" aria-hidden="true" className="shrink-0 text-warn mt-0.5"><path d="M12 2.8 22 20.5H2z" fill="currentColor" /><path d="M12 9v5.5M12 17.2v.3" stroke="var(--color-surface)" strokeWidth="2.6" strokeLinecap="round" /></svg>
              <span><strong>Caution — {HAZARD_CAUTIONS[h].title}:</strong> {HAZARD_CAUTIONS[h].text}</span>
            </li>
          ))}
        </ul>
      )}
      <p className="font-semibold">{DEFER_TO_MAKER}</p>
    </div>
  );
}
