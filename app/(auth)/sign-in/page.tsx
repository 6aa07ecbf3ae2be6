import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Suspense } from "react";
import { currentUser } from "@/lib/auth/session";
import { SignInForm } from "@/components/auth/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage() {
  if (await currentUser()) redirect("/");
  return (
    <>
      <h1 className="mb-4 text-xl font-bold">Sign in</h1>
      <Suspense>
        <SignInForm />
      </Suspense>
    </>
  );
}
