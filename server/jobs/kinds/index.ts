import { ecaAtlasKind } from "./eca-atlas";
import { lumpChainKind } from "./lump-chain";
import { lumpLargeChainKind } from "./lump-large-chain";
import { registerJobKind } from "./registry";
import { searchProjectionKind } from "./search-projection";
import { totalisticAtlasKind } from "./totalistic-atlas";
import { verifyChainKind } from "./verify-chain";
import { verifyMapKind } from "./verify-map";

// The product's job kinds; importing this module makes them known to the queue and the runner.
for (const kind of [ecaAtlasKind, searchProjectionKind, lumpChainKind, verifyChainKind]) registerJobKind(kind);
registerJobKind(totalisticAtlasKind);
registerJobKind(verifyMapKind);
registerJobKind(lumpLargeChainKind);
