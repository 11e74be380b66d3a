/** A model node's size on the canvas, in a plain module so that server pages (layout) read the numbers too. */
export const NODE_WIDTH = 190;
export const NODE_HEIGHT = 64;
