// Property tests run with one fixed seed so CI is deterministic; set FC_SEED to explore others
// (a failure prints its seed and path, which reproduce it exactly).
import fc from 'fast-check';

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261201), numRuns: Number(process.env.FC_RUNS ?? 100) });
