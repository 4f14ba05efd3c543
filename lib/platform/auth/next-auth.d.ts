import type { DefaultSession } from 'next-auth';
import type { Role } from '@/lib/domain/roles';

declare module 'next-auth' {
  interface User {
    id: string;
    role: Role;
    organizationId: string | null;
    jurisdictionId: string | null;
  }
  interface Session {
    user: DefaultSession['user'] & {
      id: string;
      role: Role;
      organizationId: string | null;
      jurisdictionId: string | null;
    };
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid: string;
    role: Role;
    organizationId: string | null;
    jurisdictionId: string | null;
  }
}
