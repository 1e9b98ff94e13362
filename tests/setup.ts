import fc from 'fast-check';

// Property tests explore new random cases on every local run (a failure prints its seed); CI
// uses one fixed seed so that a run on main is reproducible.
if (process.env.CI) fc.configureGlobal({ seed: 20261201 });
