// Runs before any island module: zod 4 otherwise probes `new Function` once to decide whether to
// compile its parsers, and under our Content-Security-Policy (no 'unsafe-eval') that probe is
// reported as a violation. Parsing without compiling is just as correct.
window.__zod_globalConfig = Object.assign(window.__zod_globalConfig || {}, { jitless: true });
