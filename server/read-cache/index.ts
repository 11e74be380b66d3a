export { StampedCache, stampOf } from "./stamped-cache";
export { sessionUserId, forgetDecodedSessions } from "./session";
