/**
 * Shown with every rating result, report and export (product brief, Cautions): the numbers
 * support an engineer's judgement and never stand in for it.
 */
export const RESULT_CAUTION =
  'Results support, and do not replace, the judgement of a licensed engineer. Local codes and the owner\'s policies govern. ' +
  'Verify every input against the plans and field measurements.';
