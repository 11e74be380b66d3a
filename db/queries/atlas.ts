/** The atlas data layer: the one way in for app/, server/ and tests. */
export { setDatabase, getDatabase, type Executor } from "./connection";
export { upsertModel, getModel, listModels, type ModelFields, type ModelKind } from "./models";
export { getCertificate, getWorkspaceCertificate, type VerifiedCertificate } from "./certificates";
export {
  createCertifiedEdge,
  getMap,
  listMapsFrom,
  listMapsTo,
  retractMap,
  EDGE_WRITE_STEPS,
  type CertifiedEdgeInput,
  type EdgeWriteStep,
  type MapKind,
  type MapView,
  type ModelRef,
  type Derivation,
} from "./maps";
export { createChain, getChain, listChains, type ChainView } from "./chains";
export { findPaths, MAX_PATH_DEPTH, type AtlasPath } from "./paths";
export {
  searchAtlas,
  getClassHierarchy,
  listSearchRecords,
  createSearchRecord,
  type AtlasSearch,
  type AtlasSearchResult,
} from "./search";
export { recordAuditEvent } from "./audit";
