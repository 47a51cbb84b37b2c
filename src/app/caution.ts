/** The caution shown at all times in the app and on every snapshot. */
export const CAUTION =
  'Tractus post-processes an analysis; it does not certify a design. Results depend on the input model. Defer to the applicable codes and to licensed engineering review.'
