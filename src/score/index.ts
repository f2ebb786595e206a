export * from './strokeScore.ts';
export * from './polyline.ts';
export * from './roc.ts';
