/** Certificates: the versioned, content-addressed record of one commuting square (DOMAIN.md §5). */
export { CertificateSchema, MapSchema, CERTIFICATE_FORMAT, CERTIFICATE_VERSION, ADDRESS_PATTERN, certificateJsonSchema } from "./schema";
export type { Certificate, CertificateMap, MapKind } from "./schema";
export { CertificateInputError, canonicalCertificate } from "./canonicalCertificate";
export { certificateAddress, certificateText, sealCertificate } from "./certificateAddress";
export type { Counterexample } from "./counterexample";
export { certifyBlocking, certifyDecimation, certifyExactLumping, certifyIterate, certifyLumping, certifyProjection, parseProjectionString } from "./builders";
export type { Built, RuleInput } from "./builders";
export { certificateSummary } from "./certificateSummary";
export type { CertificateSummary } from "./certificateSummary";
export { blockLabels, chainLabels } from "./chainLabels";
