/**
 * Runs in the browser before the app's own modules. zod (used by the form editor and the
 * engine's record schema) probes whether `new Function` works when its first object schema is
 * built; under our content security policy (no 'unsafe-eval') that probe is a reported violation.
 * Telling zod to skip its compiled fast path, through its global config object, avoids the probe.
 */
const zodConfig = globalThis as unknown as { __zod_globalConfig?: { jitless?: boolean } };
(zodConfig.__zod_globalConfig ??= {}).jitless = true;
