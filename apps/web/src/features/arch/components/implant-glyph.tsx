/**
 * A small threaded implant post with its crown cap, about 14 × 30 units, centred on (0, 0),
 * crown towards −y. The cell flips it so the crown always faces the biting plane.
 */
export function ImplantGlyph({ flip }: { flip: boolean }) {
  return (
    <g className="implant-glyph" transform={flip ? 'scale(1,-1)' : undefined} aria-hidden="true">
      <path d="M -6.5 -8 L -5.5 -13.5 Q 0 -16 5.5 -13.5 L 6.5 -8 Z" className="implant-glyph__crown" />
      <rect x={-2.5} y={-8} width={5} height={3} className="implant-glyph__neck" />
      <path d="M -4.5 -5 L 4.5 -5 L 3.6 9.5 L 0 13.5 L -3.6 9.5 Z" className="implant-glyph__body" />
      {[-1.5, 2, 5.5, 9].map((y) => (
        <line key={y} x1={-4.4} y1={y + 1.2} x2={4.2} y2={y - 1.2} className="implant-glyph__thread" />
      ))}
    </g>
  );
}
