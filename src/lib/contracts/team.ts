/** Teams, members and the signed-in user's summary, as the API returns them. */
import type { Role } from './roles';

export interface Me {
  user: { id: string; email: string; name: string };
  teams: { id: string; name: string; role: Role }[];
}

export interface ActivityOut {
  id: string | number;
  action: string;
  subjectType?: string | null;
  subjectId?: string | null;
  userName?: string | null;
  userId?: string | null;
  detail?: Record<string, unknown> | null;
  createdAt: string;
}
