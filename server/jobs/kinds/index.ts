import { registerJobKind } from "./registry";
import { verifyChainKind } from "./verify-chain";

// The product's job kinds; importing this module makes them known to the queue and the runner.
for (const kind of [verifyChainKind]) registerJobKind(kind);
