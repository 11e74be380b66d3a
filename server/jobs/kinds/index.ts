import { registerJobKind } from "./registry";

// The product's job kinds register here; importing this module makes them known to the queue and
// the runner.
const PRODUCT_KINDS = [] as const;
for (const kind of PRODUCT_KINDS) registerJobKind(kind);
