// The egg code drawn with SVG elements from the domain's drawing description (no markup
// strings): the same symbol the list, the map and the export describe.
import type { EggCode } from '../../domain/eggCode';
import { eggCodeDrawing } from '../../domain/eggCode';

export function EggCodeView({ code, size = 120, className }: { code: EggCode; size?: number; className?: string }) {
  const d = eggCodeDrawing(code);
  const height = (size * d.height) / d.width;
  return (
    <svg
      className={`egg-code ${className ?? ''}`}
      viewBox={`0 0 ${d.width} ${d.height}`}
      width={size}
      height={height}
      role="img"
      aria-label={d.title}
    >
      <title>{d.title}</title>
      {d.shapes.map((s, i) =>
        s.kind === 'ellipse' ? (
          <ellipse key={i} cx={s.cx} cy={s.cy} rx={s.rx} ry={s.ry} fill="none" stroke="currentColor" strokeWidth={2} />
        ) : s.kind === 'dot' ? (
          <circle key={i} cx={s.cx} cy={s.cy} r={s.r} fill="currentColor" data-dot-of={s.field} />
        ) : (
          <line key={i} x1={s.x1} y1={s.y1} x2={s.x2} y2={s.y2} stroke="currentColor" strokeWidth={1.5} />
        ),
      )}
      {d.texts.map((t) => (
        <text key={t.field} x={t.x} y={t.y} textAnchor="middle" dominantBaseline="central" fontSize={t.size} fill="currentColor" data-field={t.field}>
          {t.text}
        </text>
      ))}
    </svg>
  );
}
