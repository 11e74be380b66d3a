/**
 * Resolved tokens are remembered for a few seconds so that a script's burst of reads costs one
 * lookup. Revoking through this process forgets them at once; other processes of a multi-server
 * deployment stop accepting a revoked token within TOKEN_CACHE_MS.
 */
export const TOKEN_CACHE_MS = 5_000;
const MAX_ENTRIES = 10_000;

const entries = new Map<string, { value: unknown; until: number }>();

export function cachedToken<T>(hash: string, now = Date.now()): T | undefined {
  const hit = entries.get(hash);
  return hit && hit.until > now ? (hit.value as T) : undefined;
}

export function rememberToken(hash: string, value: unknown, now = Date.now()): void {
  if (entries.size >= MAX_ENTRIES) entries.clear();
  entries.set(hash, { value, until: now + TOKEN_CACHE_MS });
}

export function forgetTokens(): void {
  entries.clear();
}
