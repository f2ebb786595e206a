export * from './model.ts';
export * from './schema.ts';
export * from './projectFile.ts';
export * from './rules.ts';
export * from './layout.ts';
