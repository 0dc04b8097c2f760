/** The usual cautions shown with a step's hazards, and the sentence that defers to the maker. */
import type { Hazard } from '../../domain/procedure/schema';

export const DEFER_TO_MAKER =
  "Follow the maker's service information, local codes and licensed practice. Any numbers shown in the demo are example data, not a maker's specification.";

export const HAZARD_CAUTIONS: Record<Hazard, { title: string; text: string }> = {
  lifting: { title: 'Lifting', text: 'Use rated lifting equipment and attachment points; never work under a suspended load; keep hands and feet clear.' },
  'pressurised-fuel': { title: 'Pressurised fuel', text: 'Relieve fuel pressure before opening any line; no flames or sparks; wear eye protection; catch and contain spilled fuel.' },
  'hot-fluid': { title: 'Hot fluid', text: 'Let the engine cool before opening the cooling or oil system; release pressure slowly; wear gloves and eye protection.' },
  'spring-pressure': { title: 'Spring pressure', text: 'Use the proper compressor or tool; release spring load gradually; stand out of the line of release.' },
  'stored-energy': { title: 'Stored energy', text: 'Release or block stored energy (springs, accumulators, tensioners, raised parts) before working on it.' },
  chemical: { title: 'Chemicals', text: 'Read the safety data sheet; wear gloves and eye protection; ventilate; dispose of waste as local rules require.' },
  electrical: { title: 'Electrical', text: 'Disconnect and isolate the battery or supply before work; check that circuits are dead.' },
};
