/**
 * Further demo data, added by the parts of the app that own it (procedures, jobs, runs …).
 * Each step receives the demo shop's id and the user id of each role.
 */
import type { EntityManager } from '@mikro-orm/core';
import { seedDemoProcedures } from './demo-procedures';
import { seedDemoRuns } from './demo-runs';

export type DemoContext = { shopId: string; users: Record<string, string> };
export type DemoSeedStep = (em: EntityManager, ctx: DemoContext) => Promise<void>;

export const demoSeedSteps: DemoSeedStep[] = [seedDemoProcedures, seedDemoRuns];
