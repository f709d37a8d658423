// A shared layout, for anyone with the link: the pad chart, notes and channels, what each pad aims at (slot
// family and stroke), the hi-hat pedal, the publisher's description, a download of our layout file, and, for a
// signed-in person, importing it into one of their studios. Nothing of the publisher's kits, samples or studio.
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { currentUser, myStudios } from "@/lib/server/session";
import { viewSharedLayout } from "@/lib/server/kits/shares";
import { AppError } from "@/lib/server/errors";
import { can } from "@/lib/permissions";
import { LayoutPreview } from "@/components/layout-editor/layout-preview";
import { ImportShared } from "@/components/layout-editor/import-shared";
import { paths } from "@/components/data/paths";

export const metadata: Metadata = { title: "Shared layout", robots: { index: false } };
export const dynamic = "force-dynamic";

export default async function SharedLayoutPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const view = await viewSharedLayout(token, { count: true }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  const user = await currentUser();
  const studios = user ? (await myStudios(user.id)).filter((s) => can(s.role, "studio:write")).map((s) => ({ id: s.id, name: s.name })) : [];
  const l = view.layout;
  const surface = l.surface.kind === "grid" ? `a grid of ${l.surface.rows} × ${l.surface.cols} pads` : `${l.pads.length} trigger zones`;
  return (
    <div className="mx-auto max-w-6xl space-y-4 px-4 py-6">
      <div>
        <p className="text-sm text-muted">A shared Kitwright layout · {surface} · <span className="num">{view.views}</span> view{view.views === 1 ? "" : "s"}</p>
        <h1 className="mt-1" data-testid="shared-name">{view.name}</h1>
        {view.description && <p className="mt-2 max-w-3xl whitespace-pre-line text-sm" data-testid="shared-description">{view.description}</p>}
      </div>
      <section className="card space-y-3">
        <h2>Pads</h2>
        <p className="text-xs text-muted">Each pad: its label, the MIDI note it sends (channel when not 10), and the kind of drum and stroke it plays.</p>
        <LayoutPreview layout={l} slotFamily />
      </section>
      {l.hiHatPedal && (
        <section className="card space-y-2" data-testid="shared-pedal">
          <h2>Hi-hat pedal</h2>
          <p className="text-sm">Controller <span className="num">CC{l.hiHatPedal.controller}</span> on channel <span className="num">{l.hiHatPedal.channel}</span>, closed at the {l.hiHatPedal.closedAt} end{l.hiHatPedal.chickNote !== null ? <>; the foot chick sends note <span className="num">{l.hiHatPedal.chickNote}</span></> : null}.</p>
          <ul className="text-sm">{l.hiHatPedal.zones.map((z, i) => <li key={i}><span className="num">{z.low}–{z.high}</span>: {z.articulation}</li>)}</ul>
        </section>
      )}
      <section className="card flex flex-wrap items-start justify-between gap-4">
        <div className="space-y-1">
          <h2>Use it</h2>
          <p className="text-sm"><a href={`${paths.sharedLayout(token)}?download=1`} download data-testid="shared-download">Download the layout file</a> (kitwright.layout/v1), or copy it into one of your studios.</p>
        </div>
        {user ? <ImportShared token={token} studios={studios} /> : <p className="text-sm"><Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/shared/${token}`)}`}>Sign in</Link> to copy it into your studio.</p>}
      </section>
    </div>
  );
}
