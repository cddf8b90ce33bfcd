import type { Role } from '@burrowline/shared';

/** What a request knows about its signed-in person (loaded per request by id). */
export interface SessionUser {
  id: string;
  coopId: string;
  farmId: string | null;
  mentorId: string | null;
  email: string;
  name: string;
  role: Role;
  /** The version of the co-op's breeds and farms read with the session: lets what an instance keeps of them serve the request. */
  directoryVersion?: string;
}
