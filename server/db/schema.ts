import type { ColumnType, Generated, Insertable, Selectable, Updateable } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export type Role = 'owner' | 'grower' | 'viewer';

export interface UserTable {
  id: Generated<string>;
  email: string;
  name: string;
  password_hash: string;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface SessionTable {
  id: Generated<string>;
  user_id: string;
  created_at: Timestamp;
  expires_at: Date;
  last_seen_at: Timestamp;
  user_agent: string | null;
}

export interface BankTable {
  id: Generated<string>;
  name: string;
  last_frost: string | null;
  first_frost: string | null;
  frost_margin_days: ColumnType<number, number | undefined, number>;
  time_zone: ColumnType<string, string | undefined, string>;
  created_at: Timestamp;
  updated_at: Timestamp;
}

export interface MembershipTable {
  bank_id: string;
  user_id: string;
  role: Role;
  created_at: Timestamp;
}

export interface AppMetaTable {
  key: string;
  value: unknown;
  updated_at: Timestamp;
}

export interface InvitationTable {
  id: Generated<string>;
  bank_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  created_at: Timestamp;
  expires_at: Date;
  accepted_at: Date | null;
  accepted_by: string | null;
  revoked_at: Date | null;
}

export interface PasswordResetTable {
  id: Generated<string>;
  user_id: string;
  token_hash: string;
  created_at: Timestamp;
  expires_at: Date;
  used_at: Date | null;
}

export interface Database {
  users: UserTable;
  sessions: SessionTable;
  banks: BankTable;
  memberships: MembershipTable;
  app_meta: AppMetaTable;
  invitations: InvitationTable;
  password_resets: PasswordResetTable;
}

export type User = Selectable<UserTable>;
export type NewUser = Insertable<UserTable>;
export type UserUpdate = Updateable<UserTable>;
export type Session = Selectable<SessionTable>;
export type Bank = Selectable<BankTable>;
export type NewBank = Insertable<BankTable>;
export type BankUpdate = Updateable<BankTable>;
export type Membership = Selectable<MembershipTable>;
export type Invitation = Selectable<InvitationTable>;
