// Version of the measurement algorithms in lib/audio. Bump it whenever a change alters any number in a
// Measurement (filters, thresholds, frame sizes, summaries) so stored samples are re-measured.
// 2: the tail test reads the level at the stop and tells fades from cuts; tailEndDb and tailEndAboveFloorDb.
// 3: onsetWave, the first milliseconds of the strike (microphone offsets and polarity).
// 4: the frame features read the spectrum up to 24 kHz only (lib/audio/spectral.ts ANALYSIS_TOP_HZ): files above
//    48 kHz measure as they would at 48 kHz.
export const MEASURE_VERSION = 4;
