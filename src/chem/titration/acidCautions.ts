/**
 * The caution every titration screen and command shows, kept in one place so the app and the CLI
 * say the same thing. General practice for dilute mineral acids; it defers to the rules that
 * actually apply to the person holding the burette.
 */
export const ACID_HANDLING_CAUTION =
  'Handling acids: wear protective eyewear and gloves, add titrant slowly, keep acid away from ' +
  'skin and eyes, rinse spills with plenty of water, and follow your laboratory’s safety rules and ' +
  'the titrant’s product label and safety data sheet. Results are estimates from a model; check ' +
  'them against your own quality-control samples.';
