// Journeys drive a real browser through sign-in; jest's 5 s default is too short for them (testTimeout is not read per project).
jest.setTimeout(60_000);
