export { inkEvidence, DEFAULT_INK_OPTIONS, type InkEvidence, type InkOptions } from './evidence.ts';
