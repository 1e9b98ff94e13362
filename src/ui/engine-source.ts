/** The one place the app picks up the carbonate engine (used by the worker and by tests). */

export { plan } from '../chem/plan/plan';
export { solve } from '../chem/solve';
export { freshTitrationConstants as titrationConstants } from '../chem/titration/reduceTitration';
export { titrate } from '../chem/titration/titrate';
