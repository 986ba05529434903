import 'next-auth';
import 'next-auth/jwt';

declare module 'next-auth' {
  interface Session {
    user: { id: string; name: string; email: string };
    /** When this session signed in (ms since the epoch). */
    signedInAt?: number;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    userId?: string;
    signedInAt?: number;
  }
}
