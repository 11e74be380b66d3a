/**
 * The picture the product is named after: blocking then projecting equals projecting then
 * running the coarse rule. Drawn by hand; labels use the trade's terms.
 */
export function CommutingSquare() {
  return (
    <figure className="rounded-[var(--radius-card)] border border-line bg-paper-raised p-6 shadow-sm">
      <svg viewBox="0 0 360 260" className="w-full" role="img" aria-labelledby="square-title">
        <title id="square-title">A commuting square: the fine rule followed by the projection equals the projection followed by the coarse rule.</title>
        <defs>
          <marker id="arrow" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto-start-reverse">
            <path d="M0 0 10 5 0 10z" className="fill-tide-700" />
          </marker>
        </defs>
        <g className="font-mono" fontSize="13">
          <Corner x={40} y={40} label="X" sub="fine row" />
          <Corner x={260} y={40} label="X′" sub="after N steps" />
          <Corner x={40} y={190} label="Y" sub="coarse row" />
          <Corner x={260} y={190} label="Y′" sub="after 1 step" />
        </g>
        <g className="stroke-tide-700" strokeWidth="2" fill="none" markerEnd="url(#arrow)">
          <line x1="104" y1="62" x2="252" y2="62" />
          <line x1="104" y1="212" x2="252" y2="212" />
          <line x1="72" y1="88" x2="72" y2="182" />
          <line x1="292" y1="88" x2="292" y2="182" />
        </g>
        <g fontSize="13" className="fill-ink-soft">
          <text x="178" y="52" textAnchor="middle">supercell F</text>
          <text x="178" y="232" textAnchor="middle">coarse rule g</text>
          <text x="60" y="140" textAnchor="end">proj</text>
          <text x="304" y="140">proj</text>
        </g>
        <circle cx="324" cy="190" r="6" className="fill-saffron-300 stroke-paper-raised" strokeWidth="2" />
        <text x="180" y="140" textAnchor="middle" fontSize="22" className="fill-tide-600">
          ⟳
        </text>
      </svg>
      <figcaption className="mt-3 text-center text-sm text-ink-soft">
        proj ∘ F = g ∘ proj, for <em>every</em> window — or it stays out of the atlas.
      </figcaption>
    </figure>
  );
}

function Corner({ x, y, label, sub }: { x: number; y: number; label: string; sub: string }) {
  return (
    <g>
      <rect x={x} y={y} width="64" height="44" rx="8" className="fill-tide-50 stroke-tide-300" strokeWidth="1.5" />
      <text x={x + 32} y={y + 27} textAnchor="middle" fontSize="17" className="fill-tide-900">
        {label}
      </text>
      <text x={x + 32} y={y < 100 ? y - 8 : y + 62} textAnchor="middle" fontSize="11" className="fill-ink-faint">
        {sub}
      </text>
    </g>
  );
}
