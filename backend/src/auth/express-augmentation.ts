import type { SignedInUser } from '../../../shared/src';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport types `req.user` as Express.User; here it is always Spanledger's signed-in user.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SignedInUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    user: SignedInUser;
    /** Milliseconds since the epoch; the absolute timeout counts from here. */
    signedInAt: number;
    xsrfToken: string;
  }
}

export {};
