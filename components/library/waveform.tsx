// Waveform drawn as SVG from the server's min/max peaks per bucket; the detected onset as a marker; while the
// sample plays, a playhead (`playhead`: 0..1 of the file) with the part already heard shaded.
export function Waveform({ peaks, durationSec, onsetMs, height = 80, playhead = null }: { peaks: { min: number[]; max: number[] }; durationSec: number; onsetMs: number | null; height?: number; playhead?: number | null }) {
  const n = peaks.max.length;
  const w = 400;
  const mid = height / 2;
  // quiet files are drawn magnified (and say so) so their shape stays visible
  const peak = Math.max(1e-6, ...peaks.max.map(Math.abs), ...peaks.min.map(Math.abs));
  const zoom = peak < 0.25 ? Math.min(64, 0.9 / peak) : 1;
  const top = peaks.max.map((v, i) => `${((i + 0.5) / n) * w},${mid - Math.max(0, Math.min(1, v * zoom)) * mid}`);
  const bottom = peaks.min.map((v, i) => `${((i + 0.5) / n) * w},${mid - Math.max(-1, Math.min(0, v * zoom)) * mid}`).reverse();
  const clipped = peaks.max.some((v) => v >= 0.999) || peaks.min.some((v) => v <= -0.999);
  const onsetX = onsetMs !== null && durationSec > 0 ? (onsetMs / 1000 / durationSec) * w : null;
  return (
    <figure>
      <svg viewBox={`0 0 ${w} ${height}`} className="h-20 w-full rounded border border-line bg-paper" role="img" aria-label={`Waveform, ${durationSec.toFixed(2)} s${clipped ? ", reaches full scale" : ""}`} data-testid="waveform">
        <line x1={0} x2={w} y1={mid} y2={mid} stroke="currentColor" className="text-line" strokeWidth={0.5} />
        <polygon points={[...top, ...bottom].join(" ")} className="fill-brand" />
        {playhead !== null && (
          <g data-testid="playhead" data-position={playhead.toFixed(3)}>
            <rect x={0} y={0} width={Math.max(0, Math.min(1, playhead)) * w} height={height} className="fill-ink/10" />
            <line x1={Math.max(0, Math.min(1, playhead)) * w} x2={Math.max(0, Math.min(1, playhead)) * w} y1={0} y2={height} stroke="currentColor" className="text-ink" strokeWidth={1.5} />
          </g>
        )}
        {onsetX !== null && <line x1={onsetX} x2={onsetX} y1={0} y2={height} stroke="currentColor" className="text-warn" strokeDasharray="3 2" strokeWidth={1} />}
      </svg>
      <figcaption className="mt-1 flex justify-between gap-3 text-xs text-muted">
        <span>0 s{onsetX !== null ? " · dashed line: onset" : ""}{zoom > 1 ? <span title={`Drawn ${zoom.toFixed(1)} times taller than full scale`}> · a quiet file, drawn taller to be seen</span> : null}</span>
        <span className="num shrink-0 whitespace-nowrap">{durationSec.toFixed(2)} s</span>
      </figcaption>
    </figure>
  );
}
