/** What the chain server action answers; a success redirects to the stored chain instead. */
export type ChainActionState =
  | { status: "idle" }
  | {
      status: "error";
      message: string;
      /** The link (0-based) the server refused, when the problem is at one link. */
      link: number | null;
      /** A form field the problem belongs to. */
      field?: "name" | "links";
    };

export const idleChainState: ChainActionState = { status: "idle" };
