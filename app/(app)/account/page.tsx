// The signed-in person's account: who they are, and their personal API tokens (make, list with last use, revoke).
import type { Metadata } from "next";
import { requireUser, myStudios } from "@/lib/server/session";
import { ApiTokens } from "@/components/account/api-tokens";

export const metadata: Metadata = { title: "Account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  const user = await requireUser("/account");
  const studios = await myStudios(user.id);
  return (
    <div className="space-y-6">
      <div>
        <h1>Account</h1>
        <p className="text-sm text-muted">Signed in as <strong>{user.name}</strong> ({user.email}).</p>
      </div>
      <ApiTokens studios={studios.map((s) => ({ id: s.id, name: s.name, role: s.role }))} />
    </div>
  );
}
