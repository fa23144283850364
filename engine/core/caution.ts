/**
 * The caution shown wherever a forecast or warning reaches a person (screens, report,
 * CLI). One text, one place.
 */
export const CAUTION =
  'Estimates only, not financial, tax or legal advice. These figures are statistical ' +
  'projections from past statements and can be wrong; consult a licensed professional ' +
  'before making decisions.';
