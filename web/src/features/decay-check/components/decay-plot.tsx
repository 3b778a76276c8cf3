import type { DecaySample, DecayVerdict } from '../../../../../shared/domain';

const WIDTH = 320;
const HEIGHT = 200;
const PAD = { left: 38, right: 8, top: 20, bottom: 32 };
const FONT = 11;

/** Round steps for axis ticks: 1, 2 or 5 × 10ⁿ, about `count` of them up to `max`. */
function ticks(max: number, count: number): number[] {
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = 0; v <= max + step * 1e-9; v += step) out.push(Number(v.toPrecision(6)));
  return out;
}

/**
 * The readings against the fitted decay V0 · e^(−t/τ): used readings filled, readings left out
 * hollow and crossed, the 60 V line dashed. Scales with its box; a plain SVG, no chart library.
 */
export function DecayPlot({ samples, verdict }: { samples: readonly DecaySample[]; verdict: DecayVerdict }) {
  const { fit } = verdict;
  const excluded = new Map(fit.excluded.map((e) => [e.index, e]));
  const curve = (t: number) => fit.v0Volts * Math.exp(-t / fit.tauSeconds);
  const used = samples.map((s, index) => ({ index, t: s.tSeconds, volts: s.volts })).filter((p) => !excluded.has(p.index));
  const left = fit.excluded.map((e) => ({ index: e.index, t: e.tSeconds, volts: e.volts, code: e.code }));
  const tMax = Math.max(...samples.map((s) => s.tSeconds), 1);
  const vMax = Math.max(fit.v0Volts, ...used.map((p) => p.volts), ...left.map((p) => p.volts), 1) * 1.05;
  const x = (t: number) => PAD.left + (t / tMax) * (WIDTH - PAD.left - PAD.right);
  const y = (v: number) => HEIGHT - PAD.bottom - (Math.max(0, Math.min(v, vMax)) / vMax) * (HEIGHT - PAD.top - PAD.bottom);
  const path = Array.from({ length: 61 }, (_, i) => (tMax * i) / 60)
    .map((t, i) => `${i === 0 ? 'M' : 'L'}${x(t).toFixed(1)},${y(curve(t)).toFixed(1)}`)
    .join(' ');
  const tTicks = ticks(tMax, 4).filter((t) => t <= tMax);
  const vTicks = ticks(vMax, 4).filter((v) => v <= vMax);
  return (
    <figure className="w-full">
      <svg
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        className="h-auto w-full max-w-md"
        role="img"
        aria-label={`Readings against the fitted decay: ${used.length} used, ${left.length} left out`}
        data-testid="decay-plot"
      >
        {vTicks.map((v) => (
          <g key={`v${v}`}>
            <line x1={PAD.left} x2={WIDTH - PAD.right} y1={y(v)} y2={y(v)} className="stroke-tide-100" strokeWidth={1} />
            <text x={PAD.left - 4} y={y(v) + 3} textAnchor="end" className="fill-tide-600" fontSize={FONT}>
              {v}
            </text>
          </g>
        ))}
        {tTicks.map((t) => (
          <text key={`t${t}`} x={x(t)} y={HEIGHT - PAD.bottom + 13} textAnchor="middle" className="fill-tide-600" fontSize={FONT}>
            {t}
          </text>
        ))}
        <text x={(PAD.left + WIDTH - PAD.right) / 2} y={HEIGHT - 4} textAnchor="middle" className="fill-tide-800" fontSize={FONT}>
          time since isolation (s)
        </text>
        <text x={PAD.left} y={FONT} className="fill-tide-800" fontSize={FONT}>
          DC bus (V)
        </text>
        {60 < vMax ? (
          <g>
            <line x1={PAD.left} x2={WIDTH - PAD.right} y1={y(60)} y2={y(60)} className="stroke-eol-600" strokeDasharray="4 3" strokeWidth={1} />
            <text x={WIDTH - PAD.right - 2} y={y(60) - 3} textAnchor="end" className="fill-eol-600" fontSize={FONT}>
              60 V
            </text>
          </g>
        ) : null}
        <path d={path} fill="none" className="stroke-tide-600" strokeWidth={1.5} />
        {used.map((p) => (
          <circle key={p.index} cx={x(p.t)} cy={y(p.volts)} r={3} className="fill-tide-900" />
        ))}
        {left.map((p) => (
          <g key={p.index} className={p.code === 'control-supply-phase' ? 'stroke-watch-600' : 'stroke-eol-600'}>
            <circle cx={x(p.t)} cy={y(p.volts)} r={4} fill="white" strokeWidth={1.5} />
            <line x1={x(p.t) - 3} x2={x(p.t) + 3} y1={y(p.volts) - 3} y2={y(p.volts) + 3} strokeWidth={1.2} />
          </g>
        ))}
      </svg>
      <figcaption className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-tide-800">
        <span>● reading used</span>
        <span className="text-eol-600">⊗ left out</span>
        <span>— fitted decay</span>
        <span className="text-eol-600">- - 60 V</span>
      </figcaption>
    </figure>
  );
}
