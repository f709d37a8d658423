// Version of the measurement algorithms in lib/audio. Bump it whenever a change alters any number in a
// Measurement (filters, thresholds, frame sizes, summaries) so stored samples are re-measured.
export const MEASURE_VERSION = 1;
