/** The canvas tools: one folder and one small state machine each (types.ts is the contract). */
import type { ToolName } from '../store/store.ts';
import { createCalibrateTool, type CalibrateTool } from './calibrate/calibrateTool.ts';
import { createFollowTool } from './follow/followTool.ts';
import { createLetterTool, type LetterTool } from './letter/letterTool.ts';
import { createPanTool } from './pan/panTool.ts';
import { createRefineTool, type RefineTool } from './refine/refineTool.ts';
import type { Tool, ToolContext } from './types.ts';

export function createTool(name: 'refine', ctx: ToolContext): RefineTool;
export function createTool(name: 'calibrate', ctx: ToolContext): CalibrateTool;
export function createTool(name: 'letter', ctx: ToolContext): LetterTool;
export function createTool(name: ToolName, ctx: ToolContext): Tool;
export function createTool(name: ToolName, ctx: ToolContext): Tool {
  switch (name) {
    case 'follow': return createFollowTool(ctx);
    case 'refine': return createRefineTool(ctx);
    case 'pan': return createPanTool(ctx);
    case 'calibrate': return createCalibrateTool(ctx);
    case 'letter': return createLetterTool(ctx);
  }
}

export { createFollowTool, createPanTool, createRefineTool, type RefineTool };
export { createCalibrateTool, lineLength, parseMm, MIN_RULER_PX, type CalibrateTool } from './calibrate/calibrateTool.ts';
export { createLetterTool, parseLost, type LetterTool } from './letter/letterTool.ts';
export { boxOf, letterAt, makeLetterOfPicked, markAt, strokesInBox } from './letter/pick.ts';
export { pinRadius, markSpan, type ActionDeps } from './refine/actions.ts';
export { anchorsWithInserted, anchorsWithout, anchorsWithRadius, overridesWithSpan, spanMarking, type SpanMarking } from './refine/edits.ts';
export { handleKey, findBinding, isTyping, keyLabel, KEY_BINDINGS, type KeyApi, type KeyBinding, type KeyInput, type KeyOutcome } from './keys.ts';
export { hitAnchorIn, hitStrokeIn } from './hit.ts';
export type { Tool, ToolContext, ToolEvent, StrokeHit, AnchorHit } from './types.ts';
