import bcrypt from "bcryptjs";

/** bcrypt cost 10: about 0.1 s per hash in pure JavaScript on this class of machine (common practice). */
const COST = 10;

export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, COST);
}

export function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  // Compare against a fixed hash when there is none, so that "no such user" takes as long as "wrong password".
  return bcrypt.compare(password, hash ?? DUMMY_HASH);
}

const DUMMY_HASH = "$2b$10$CwTycUXWue0Thq9StjUM0uJ8Ol2G1jRzS4Ue9pC1jQ4JQ6Jt3qBfe";
