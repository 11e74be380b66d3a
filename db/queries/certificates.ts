import "server-only";
import { eq } from "drizzle-orm";
import { certificates, type Certificate } from "@/db/schema";
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
