// Shown in place of a page section that the viewer's role does not allow (words from lib/permissions.ts).
import { KEPT_PERMISSION, PERMISSION_INFO, rolesWith, roleWithArticle, whoCan, type Permission, type Role } from "@/lib/permissions";

export function NotAllowed({ permission, role }: { permission: Permission; role: Role }) {
  return (
    <div className="card" role="alert" data-testid="not-allowed">
      <h2>Not available to your role</h2>
      <p className="mt-2 text-sm text-muted">Only studio {whoCan(permission)} can {PERMISSION_INFO[permission].summary}. You are {roleWithArticle(role)} here; {rolesWith(KEPT_PERMISSION).map(roleWithArticle).join(" or ")} can change that.</p>
    </div>
  );
}
