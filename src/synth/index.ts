/**
 * Synthetic inscriptions with ground truth: an invented script written in faded ink on
 * an invented clay sherd, for the demo and for measuring the tracer against the truth.
 */
export { synthesize } from './synthesize.ts';
export { DEMO_SEED, demoOptions, testSetRecipe } from './recipes.ts';
export { DEGRADATION_PRESETS, type Degradation } from './presets.ts';
export type { SynthOptions, SynthResult } from './options.ts';
export { ALPHABET, type LetterTemplate } from './alphabet.ts';
export * from './types.ts';
