// Shown in place of a page section that the viewer's role does not allow.
export function NotAllowed({ what, role }: { what: string; role: string }) {
  return (
    <div className="card" role="alert" data-testid="not-allowed">
      <h2>Not available to your role</h2>
      <p className="mt-2 text-sm text-muted">Only studio owners can {what}. You are a{role === "editor" ? "n" : ""} {role} here; an owner can change that.</p>
    </div>
  );
}
