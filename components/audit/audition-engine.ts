// Audition in the browser with Web Audio: pick the layer a velocity falls in, cycle its round robins, load
// the sample audio (through the loader it is given: components/data/samples.ts loadSampleAudio) and play it
// through a master level (starting at -24 dB) and an optional limiter (DynamicsCompressorNode with a high
// ratio and fast attack).
import type { PlayFinding } from "@/lib/audit/types";

export interface SoundLayer { index: number; velocityLow: number; velocityHigh: number; sampleIds: string[] }
export interface SoundInstrument { id: string; name: string; libraryId: string; articulations: Array<{ articulation: string; mic?: string | null; layers: SoundLayer[] }> }

export const START_LEVEL_DB = -24;

/** The layer a velocity (1-127) falls in; outside every layer, the nearest one (velocity gaps still sound). */
export function layerFor(layers: SoundLayer[], velocity: number): SoundLayer | null {
  const filled = layers.filter((l) => l.sampleIds.length > 0);
  if (!filled.length) return null;
  const hit = filled.find((l) => velocity >= l.velocityLow && velocity <= l.velocityHigh);
  if (hit) return hit;
  let best = filled[0]!;
  let d = Infinity;
  for (const l of filled) {
    const dist = velocity < l.velocityLow ? l.velocityLow - velocity : velocity - l.velocityHigh;
    if (dist < d) { d = dist; best = l; }
  }
  return best;
}

export const dbToGain = (db: number) => Math.pow(10, db / 20);

/** What was played: a line of text, and for a sound that started, when it ends. */
export interface PlayInfo { text: string; ok: boolean; ended?: Promise<void> }

export class AuditionEngine {
  private ctx: AudioContext | null = null;
  private master: GainNode | null = null;
  private limiter: DynamicsCompressorNode | null = null;
  private limiterOn = true;
  private levelDb = START_LEVEL_DB;
  private buffers = new Map<string, Promise<AudioBuffer>>();
  private rr = new Map<string, number>();

  constructor(private loadAudio: (libraryId: string, sampleId: string) => Promise<ArrayBuffer>) {}

  private ensure(): AudioContext {
    if (!this.ctx) {
      const Ctx = window.AudioContext ?? (window as unknown as { webkitAudioContext: typeof AudioContext }).webkitAudioContext;
      this.ctx = new Ctx();
      this.master = this.ctx.createGain();
      this.master.gain.value = dbToGain(this.levelDb);
      this.limiter = this.ctx.createDynamicsCompressor();
      this.limiter.threshold.value = -6;
      this.limiter.knee.value = 0;
      this.limiter.ratio.value = 20;
      this.limiter.attack.value = 0.001;
      this.limiter.release.value = 0.1;
      this.route();
    }
    return this.ctx;
  }

  private route() {
    if (!this.ctx || !this.master || !this.limiter) return;
    this.master.disconnect();
    this.limiter.disconnect();
    if (this.limiterOn) { this.master.connect(this.limiter); this.limiter.connect(this.ctx.destination); }
    else this.master.connect(this.ctx.destination);
  }

  setLevel(db: number) {
    this.levelDb = db;
    if (this.master && this.ctx) this.master.gain.setTargetAtTime(dbToGain(db), this.ctx.currentTime, 0.01);
  }
  setLimiter(on: boolean) { this.limiterOn = on; this.route(); }

  private load(libraryId: string, sampleId: string): Promise<AudioBuffer> {
    let p = this.buffers.get(sampleId);
    if (!p) {
      p = this.loadAudio(libraryId, sampleId).then((bytes) => this.ensure().decodeAudioData(bytes));
      p.catch(() => this.buffers.delete(sampleId));
      this.buffers.set(sampleId, p);
    }
    return p;
  }

  /** Play what `finding` plays at `velocity`; resolves with a line saying what was played (or why not). */
  async play(finding: PlayFinding, velocity: number, sounds: SoundInstrument[]): Promise<PlayInfo> {
    if (finding.outcome === "silent" || !finding.plays || !finding.instrumentId) return { ok: false, text: "Silent: nothing to play." };
    const inst = sounds.find((s) => s.id === finding.instrumentId);
    if (!inst) return { ok: false, text: "The instrument is no longer in the catalogue." };
    const arts = inst.articulations.filter((a) => a.articulation === finding.plays);
    const art = arts.find((a) => (a.mic ?? null) === (finding.mic ?? null)) ?? arts[0];
    const layer = art ? layerFor(art.layers, velocity) : null;
    if (!art || !layer) return { ok: false, text: "No recorded layer to play." };
    const key = `${inst.id}|${art.articulation}|${art.mic ?? ""}|${layer.index}`;
    const n = this.rr.get(key) ?? 0;
    this.rr.set(key, n + 1);
    const take = n % layer.sampleIds.length;
    const ctx = this.ensure();
    if (ctx.state === "suspended") await ctx.resume();
    let ended: Promise<void>;
    try {
      const buf = await this.load(inst.libraryId, layer.sampleIds[take]!);
      const src = ctx.createBufferSource();
      src.buffer = buf;
      src.connect(this.master!);
      ended = new Promise<void>((resolve) => { src.onended = () => resolve(); });
      src.start();
    } catch (e) {
      return { ok: false, text: `Could not play: ${(e as Error).message}.` };
    }
    const pos = art.layers.filter((l) => l.sampleIds.length).sort((a, b) => a.velocityLow - b.velocityLow).indexOf(layer) + 1;
    return { ok: true, ended, text: `${inst.name}: ${art.articulation}, velocity ${velocity} → layer ${pos}/${art.layers.length} (${layer.velocityLow}-${layer.velocityHigh}), take ${take + 1}/${layer.sampleIds.length}` };
  }

  close() { void this.ctx?.close(); this.ctx = null; }
}
