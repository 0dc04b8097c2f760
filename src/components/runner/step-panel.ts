/** What every per-kind panel of the runner receives. */
import type { RunSync } from './use-run-sync';
import type { PreferredUnits } from './types';

export type StepPanelProps = { sync: RunSync; units: PreferredUnits };
