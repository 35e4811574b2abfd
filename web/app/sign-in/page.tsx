import { AuthForm } from "../components/auth-form";

export const metadata = { title: "Sign in · Teardown Ledger" };

/** /sign-in: email and password; then `?next=` or /teams. */
export default async function SignInPage(props: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await props.searchParams;
  return (
    <>
      <h1>Sign in</h1>
      <AuthForm mode="sign-in" next={typeof next === "string" ? next : null} />
    </>
  );
}
