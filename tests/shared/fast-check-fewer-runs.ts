// Stands in for fast-check under `npm run test:mutation -- … --property-runs <fraction>` (vitest.config.mts
// aliases the package here only then): every property runs that fraction of its cases, at least one.
// A mutant the fewer cases kill is killed by a real counter-example; one they miss counts as survived,
// so a score measured this way can only be lower than with every case. The engine's property tests are
// most of its mutation run's time (each survivor runs them all), hence the knob.
import fc from '../../node_modules/fast-check/lib/fast-check.js';

const fraction = Number(process.env.FISHPLATE_MUTATION_PROPERTY_RUNS);
if (!(fraction > 0 && fraction <= 1)) throw new Error(`FISHPLATE_MUTATION_PROPERTY_RUNS must be in (0, 1], not ${process.env.FISHPLATE_MUTATION_PROPERTY_RUNS}`);

const fewer = (numRuns: number | undefined) => Math.max(1, Math.ceil((numRuns ?? fc.readConfigureGlobal().numRuns ?? 100) * fraction));

const assert = ((property: Parameters<typeof fc.assert>[0], params?: Parameters<typeof fc.assert>[1]) =>
  fc.assert(property, { ...params, numRuns: fewer(params?.numRuns) })) as typeof fc.assert;

export default { ...fc, assert };
