import katex from "katex";
import { describe, expect, it } from "vitest";
import { tikzSquare } from "./tikzSquare";
import { tikzToCd } from "./tikzToCd";

// A tikz-cd square written out by hand (not by tikzSquare), with the labels' sides as tikz-cd places them.
const HAND_WRITTEN = String.raw`% \usepackage{tikz-cd}
\begin{tikzcd}
  \{0,1\}^{\mathbb{Z}} \arrow[r, "f_{146}^{3}"] \arrow[d, "\pi \circ B_{3}"'] & \{0,1\}^{\mathbb{Z}} \arrow[d, "\pi \circ B_{3}"] \\
  \{0,1\}^{\mathbb{Z}} \arrow[r, "g_{128}"'] & \{0,1\}^{\mathbb{Z}}
\end{tikzcd}`;

describe("tikzToCd", () => {
  it("turns a 2 × 2 tikz-cd square into KaTeX's CD with each label on the same side", () => {
    expect(tikzToCd(HAND_WRITTEN)).toBe(
      [
        String.raw`\begin{CD}`,
        String.raw`\{0,1\}^{\mathbb{Z}} @>{f_{146}^{3}}>> \{0,1\}^{\mathbb{Z}} \\`,
        String.raw`@V{\pi \circ B_{3}}VV @VV{\pi \circ B_{3}}V \\`,
        String.raw`\{0,1\}^{\mathbb{Z}} @>>{g_{128}}> \{0,1\}^{\mathbb{Z}}`,
        String.raw`\end{CD}`,
      ].join("\n"),
    );
  });

  it("reads every square the download produces, and KaTeX renders it without an error", () => {
    const squares = [
      { kind: "projection", block: 3, steps: 3, source: { kind: "eca", rule: 146 }, target: { kind: "eca", rule: 128 } },
      { kind: "lumping", source: { kind: "markov", states: 4 }, target: { kind: "markov", states: 3 } },
      { kind: "decimation", steps: 7, source: { kind: "markov", states: 4 }, target: { kind: "markov", states: 4 } },
      { kind: "projection", block: 3, steps: 3, source: { kind: "eca", rule: 23 }, target: { kind: "ca", alphabet: 3 } },
    ];
    for (const square of squares) {
      const cd = tikzToCd(tikzSquare(square));
      expect(cd).not.toBeNull();
      const html = katex.renderToString(cd!, { displayMode: true, throwOnError: true });
      expect(html).toContain("katex-display");
    }
  });

  it("refuses a diagram that is not a 2 × 2 square", () => {
    expect(tikzToCd(String.raw`\begin{tikzcd} A \arrow[r] & B \end{tikzcd}`)).toBeNull();
    expect(tikzToCd("no diagram here")).toBeNull();
  });
});
