export * from './types.ts';
export { DEFAULT_WEIGHTS, DEFAULT_CHORD, type Weights, type ChordModel } from './energy.ts';
export { prepareInk, type PreparedInk } from './prepare.ts';
export {
  followStroke, validateRequest, FollowError, FollowCancelled, DEFAULT_RADIUS,
  type FollowRequest, type FollowResult, type FollowStats, type FollowControl,
} from './follow.ts';
export { PreviewTree, startPreview, type PreviewOptions } from './preview.ts';
