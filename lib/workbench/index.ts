export { buildRequest } from "./buildRequest";
export type { MapSpec } from "./mapSpec";
