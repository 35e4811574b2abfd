import { AuthForm } from "../components/auth-form";

export const metadata = { title: "Create an account · Teardown Ledger" };

/** /sign-up: a new account with name, email and password; then `?next=` or /teams. */
export default async function SignUpPage(props: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await props.searchParams;
  return (
    <>
      <h1>Create an account</h1>
      <AuthForm mode="sign-up" next={typeof next === "string" ? next : null} />
    </>
  );
}
