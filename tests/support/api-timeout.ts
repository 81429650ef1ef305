// Each API suite starts its own server — database, background job queue, identity provider — in its
// set-up; on a loaded two-core machine that passes jest's 5 s default (testTimeout is not read per project).
jest.setTimeout(30_000);
