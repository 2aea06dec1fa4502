/** The notice every report carries. */
export const PLANNING_CAUTION =
  'Planning aid only: these predictions must be verified independently before any uplink or clock adjustment. Local regulations and operator procedures come first.';
