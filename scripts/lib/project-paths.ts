import path from 'node:path';

export const PROJECT_ROOT = path.resolve(__dirname, '../..');
/** Git-ignored machine state: the project-local database cluster, keys, logs. */
export const DATA_DIR = path.join(PROJECT_ROOT, '.data');
export const TEST_OUTPUT_DIR = path.join(PROJECT_ROOT, 'test-output');
export const FRONTEND_DIST_DIR = path.join(PROJECT_ROOT, 'dist', 'frontend');
