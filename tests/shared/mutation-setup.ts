import fc from 'fast-check';

// Loaded only under Stryker (vitest.config.mts). A property test that fails on a mutant has killed it;
// shrinking the counter-example to its smallest form only costs time (on the engine, often more than
// the mutant's time-out, so the worker was restarted for nothing). The failure itself is unchanged.
fc.configureGlobal({ endOnFailure: true });
