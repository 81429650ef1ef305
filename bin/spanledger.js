#!/usr/bin/env node
// The Spanledger command line: the engine's TypeScript runs through tsx, with no build step.
require('tsx/cjs');
require('../shared/src/cli/main.ts');
