/** The caution every result panel, export and report carries. */
export const RESULT_CAUTION = 'Results are estimates for engineers to check. Settlement depends on parameters with wide natural scatter and on sample quality; 1-D theory ignores lateral strain, creep coupling and large strain. Design must follow local codes and be checked by a licensed engineer.'
