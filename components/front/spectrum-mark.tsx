/**
 * The front page's picture: measured lines above a baseline, computed lines below,
 * slightly off — what Lattice Ledger compares. Decorative (the text says it all).
 */
const MEASURED = [92, 168, 205, 261, 318, 402, 455, 512, 566];
const HEIGHTS = [38, 64, 30, 88, 52, 74, 44, 96, 58];
const SHIFT = [3, -4, 6, -2, 8, -5, 2, -9, 4];

export function SpectrumMark() {
  return (
    <svg viewBox="0 0 640 220" className="h-auto w-full" aria-hidden="true" focusable="false">
      <line x1="40" y1="110" x2="620" y2="110" stroke="currentColor" strokeOpacity="0.35" strokeWidth="1.5" />
      {MEASURED.map((x, i) => (
        <g key={x}>
          <line x1={x} y1="108" x2={x} y2={108 - HEIGHTS[i]} stroke="var(--color-accent)" strokeWidth="5" strokeLinecap="round" />
          <line x1={x + SHIFT[i]} y1="112" x2={x + SHIFT[i]} y2={112 + HEIGHTS[i] * 0.8} stroke="var(--color-warn)" strokeWidth="5" strokeLinecap="round" strokeOpacity="0.85" />
        </g>
      ))}
      <text x="40" y="24" fontSize="13" fill="currentColor" fillOpacity="0.6">
        measured
      </text>
      <text x="40" y="206" fontSize="13" fill="currentColor" fillOpacity="0.6">
        computed
      </text>
    </svg>
  );
}
