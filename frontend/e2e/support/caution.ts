/** The research-use caution every review screen shows, word for word (docs/user-guide.md). */
export const RESEARCH_CAUTION =
  'Research use only. Not a diagnostic device: do not use these results for clinical decisions. Follow your study protocol, local regulations and licensed clinicians.';
