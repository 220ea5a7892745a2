"use client";

import { signOut } from "next-auth/react";
import { Button } from "@/components/ui/form";

export function SignOutButton() {
  return (
    <Button variant="quiet" onClick={() => signOut({ callbackUrl: "/sign-in" })} data-testid="sign-out" title="Signs you out on every device">
      Sign out
    </Button>
  );
}
