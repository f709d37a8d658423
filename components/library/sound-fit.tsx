"use client";
// What the sound alone says of a sample: the families it weighed as bars (longest = best fit), whatever labels the
// sample ended with. A name or a member may have decided otherwise; the bars show how sure the sound was and what
// it hesitated between (a crash or a china, a tom or a hand drum), so a producer auditing an import sees where to
// listen first.
import type { SampleDetail } from "@/lib/api-types/samples";
import { formatConfidence } from "@/lib/catalogue/confidence";
import { familyWords } from "@/lib/catalogue/taxonomy";

const SOURCE_WORDS: Record<NonNullable<SampleDetail["sound"]>["source"], string> = {
  model: "share of the trained model's votes",
  rules: "how well the rules of thumb fit",
  labels: "share of the nearest samples your studio confirmed",
};

const DECIDED_BY: Record<string, string> = { name: "its name", person: "a member's label", sound: "the sound" };

export function SoundFit({ sound, family, familySource }: { sound: NonNullable<SampleDetail["sound"]>; family: string | null; familySource: string | null }) {
  if (sound.fit.length === 0) return null;
  const differs = family !== null && family !== sound.family;
  return (
    <figure data-testid="sound-fit" className="space-y-1">
      <figcaption className="text-xs">
        <span className="font-semibold">What the sound alone says</span>{" "}
        <span className="text-muted">({SOURCE_WORDS[sound.source]})</span>
      </figcaption>
      <ul className="space-y-1" aria-label="Families the sound weighed, best first">
        {sound.fit.map((f, i) => {
          const pct = Math.round(f.fit * 100);
          return (
            <li key={f.family} className="grid grid-cols-[6.5rem_1fr_2.75rem] items-center gap-2 text-xs" data-testid="sound-fit-row">
              <span className={i === 0 ? "font-semibold" : "text-muted"}>{familyWords(f.family)}</span>
              <span className="h-2.5 rounded-sm bg-line/60" aria-hidden="true">
                <span className={`block h-full rounded-sm ${i === 0 ? "bg-brand" : "bg-line-strong"}`} style={{ width: `${Math.max(2, pct)}%` }} />
              </span>
              <span className="num text-right">{pct} %</span>
            </li>
          );
        })}
      </ul>
      {sound.source === "model" && (
        <p className="text-xs text-muted" data-testid="sound-fit-confidence">
          Votes are not odds: answers given with this share of the votes were right {formatConfidence(sound.confidence)} of the time on recordings the model had not heard.
        </p>
      )}
      {differs && (
        <p className="text-xs text-muted">
          Labelled {familyWords(family)} by {DECIDED_BY[familySource ?? ""] ?? "another rule"}, not by the sound.
        </p>
      )}
    </figure>
  );
}
