export { parseArxivId } from "./parseArxivId";
export { parseDoi } from "./parseDoi";
export { parseReference, referenceUrl, type Reference } from "./parseReference";
