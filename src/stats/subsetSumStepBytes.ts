// Generated from subsetSumStep.wat by scripts/subsetSumWasm.ts (`npx tsx scripts/subsetSumWasm.ts`); do not edit.
// test/stats/subsetSumStep.test.ts fails when these bytes and the .wat disagree.

/** The subset-sum step module (subsetSumStep.wat), a WebAssembly binary in base64. */
export const SUBSET_SUM_STEP_BASE64 =
  "AGFzbQEAAAABCAFgBH9/f38AAwIBAAUGAQEB//8BBxECBm1lbW9yeQIABHN0ZXAAAAq0AQGxAQIDfwJ7IAAgAkEDa0EDdGohBCAEIANBA3RrIQUgACABQQN0aiEGAkADQCAEIAZIDQEgBP0ABBAgBf0ABBD98AEhByAE/QAEACAF/QAEAP3wASEIIAQgB/0LBBAgBCAI/QsEACAEQSBrIQQgBUEgayEFDAALCyAEQRhqIQQgBUEYaiEFAkADQCAEIAZIDQEgBCAEKwMAIAUrAwCgOQMAIARBCGshBCAFQQhrIQUMAAsLCw==";
