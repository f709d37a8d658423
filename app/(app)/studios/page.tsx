import type { Metadata } from "next";
import Link from "next/link";
import { requireUser } from "@/lib/server/session";
import { listStudiosForUser } from "@/lib/server/studios";
import { CreateStudioForm } from "@/components/studio-forms";

export const metadata: Metadata = { title: "Studios" };

export default async function StudiosPage() {
  const user = await requireUser("/studios");
  const studios = await listStudiosForUser(user.id);
  return (
    <div className="grid grid-cols-1 gap-8 md:grid-cols-[minmax(0,1fr)_320px]">
      <section className="space-y-4">
        <h1>Your studios</h1>
        {studios.length === 0 ? (
          <p className="text-muted">You do not belong to a studio yet. Create one, or open an invitation someone sent you.</p>
        ) : (
          <ul className="space-y-2" data-testid="studio-list">
            {studios.map((s) => (
              <li key={s.id} className="card flex items-center justify-between py-3">
                <Link href={`/s/${s.id}`} className="font-medium">{s.name}</Link>
                <span className="tag border-line text-muted">{s.role}</span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <aside className="card h-fit"><CreateStudioForm /></aside>
    </div>
  );
}
