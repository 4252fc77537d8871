// The account as the rest of the server handles it. The fields are copied by name, not spread, so that the
// password hash, and any column later added to the stored row, is never handed on by accident.
import type { Account, AccountWithHash } from '../storage/types.js';

export function accountWithoutHash(account: AccountWithHash): Account {
  return {
    id: account.id,
    username: account.username,
    role: account.role,
    mustChangePassword: account.mustChangePassword,
    createdAt: account.createdAt,
  };
}
