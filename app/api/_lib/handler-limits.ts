/** Request bodies above this are refused with 413 before they are parsed. */
export const MAX_BODY_BYTES = 2 * 1024 * 1024;
