/** Methods and groups with fewer included pairs show N only (no MAE, no rank). */
export const MIN_PAIRS_FOR_STATISTICS = 3;
