export type Role = "depositor" | "curator" | "admin";

export interface SessionUser {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  emailVerified: boolean;
}

export interface SessionInfo {
  user: SessionUser | null;
  csrfToken: string;
}
