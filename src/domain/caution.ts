/** Shown with every grade, on screen, in print and on the command line. */
export const GRADE_CAUTION =
  'Quality levels are graded against ISO 5817 limits transcribed by Beadbook; rows marked "unverified" rest on ' +
  'recalled values until your organisation loads a table checked against a licensed copy. Acceptance of a weld ' +
  "follows the project's specification and the governing code, decided by the responsible, qualified person.";

/** Shown wherever km, Kt, a fatigue class or a life figure appears. */
export const INDICATIVE_CAUTION =
  'km, Kt, fatigue-class and life figures are indicative estimates from published parametric formulas. They do ' +
  'not replace an assessment to the governing design code by a qualified engineer.';
