import "server-only";
import { and, eq, exists, or } from "drizzle-orm";
import { certificates, chains, maps, type Certificate } from "@/db/schema";
import { type Executor, getDatabase, withDb } from "./connection";

/** A certificate as the server verified it, ready to store. */
export type VerifiedCertificate = {
  address: string;
  kind: string;
  formatVersion: number;
  /** Canonical JSON of the certificate. */
  body: string;
  checkerVersion: string;
  verifiedAt: Date;
};

/** Certificates are global and immutable: storing one that exists already changes nothing. */
export async function storeCertificate({
  db,
  certificate,
  userId,
}: {
  db: Executor;
  certificate: VerifiedCertificate;
  userId: string | null;
}): Promise<void> {
  await db
    .insert(certificates)
    .values({ ...certificate, createdBy: userId })
    .onConflictDoNothing({ target: certificates.address });
}

export async function getCertificate({
  db = getDatabase(),
  address,
}: {
  db?: Executor;
  address: string;
}): Promise<Certificate | null> {
  return withDb("reading a certificate", async () => {
    const row = await db.select().from(certificates).where(eq(certificates.address, address)).get();
    return row ?? null;
  });
}

/**
 * A certificate as one workspace sees it: only when one of its maps or chains cites it. Certificates
 * are stored once for the installation, so an address alone must not open another workspace's.
 */
export async function getWorkspaceCertificate({
  db = getDatabase(),
  workspaceId,
  address,
}: {
  db?: Executor;
  workspaceId: string;
  address: string;
}): Promise<Certificate | null> {
  return withDb("reading a certificate", async () => {
    const cited = or(
      exists(
        db
          .select({ one: maps.id })
          .from(maps)
          .where(and(eq(maps.workspaceId, workspaceId), eq(maps.certificateAddress, certificates.address))),
      ),
      exists(
        db
          .select({ one: chains.id })
          .from(chains)
          .where(and(eq(chains.workspaceId, workspaceId), eq(chains.compositeCertificateAddress, certificates.address))),
      ),
    );
    const row = await db
      .select()
      .from(certificates)
      .where(and(eq(certificates.address, address), cited))
      .get();
    return row ?? null;
  });
}
