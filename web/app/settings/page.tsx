import { requirePageCaller } from "../components/current-caller";
import { ChangePasswordForm, SignOutEverywhere } from "./account-forms";
import { ApiTokens } from "./api-tokens";

export const metadata = { title: "Settings · Teardown Ledger" };
export const dynamic = "force-dynamic";

/** /settings: the account, its password, its sessions and its API tokens. */
export default async function SettingsPage() {
  const caller = await requirePageCaller("/settings");
  return (
    <>
      <h1>Settings</h1>
      <p className="muted">
        Signed in as <strong>{caller.name}</strong> ({caller.email}).
      </p>
      <div className="columns">
        <section className="card">
          <h2>Password</h2>
          <ChangePasswordForm />
        </section>
        <section className="card">
          <h2>Sessions</h2>
          <SignOutEverywhere />
        </section>
      </div>
      <section className="card">
        <h2>API tokens</h2>
        <ApiTokens />
      </section>
    </>
  );
}
