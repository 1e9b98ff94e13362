/** The one place the app picks up the carbonate engine (used by the workers and by tests). */

export { plan } from '../chem/plan/plan';
export { solve } from '../chem/solve';
