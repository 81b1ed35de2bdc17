import type { Role } from '../../shared/roles';

declare global {
  namespace Express {
    /** What passport keeps on req.user: never the password hash. */
    interface User {
      id: string;
      email: string;
      displayName: string;
    }
    interface Request {
      /** Set by cellarAccess for routes under /api/cellars/:cellarId. */
      cellar?: { id: string; role: Role };
    }
  }
}

export {};
