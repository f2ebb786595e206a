#!/usr/bin/env node
// Runs the TypeScript CLI straight from the checkout (no build step) through tsx.
import { register } from 'tsx/esm/api';

register();
await import('../src/cli/main.ts');
