"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { zodErrors, type FormState } from "@/components/ui/form-state";
import { createSession, isHttps, sessionCookie } from "@/lib/auth/session";
import { acceptInvitation } from "@/lib/data/invitations";
import { AppError } from "@/lib/http/errors";
import { invitationAcceptInput } from "@/lib/validation/auth";

export type AcceptState = FormState<{ name?: string }> & {
  /** The invitation can no longer be used (used, withdrawn, expired, or the e-mail has an account). */
  linkProblem?: string;
};

const acceptForm = invitationAcceptInput
  .extend({ confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], error: "The two passwords differ." });

export async function acceptInvitationAction(_prev: AcceptState, form: FormData): Promise<AcceptState> {
  const name = String(form.get("name") ?? "");
  const parsed = acceptForm.safeParse({
    token: form.get("token") ?? "",
    name,
    password: form.get("password") ?? "",
    confirm: form.get("confirm") ?? "",
  });
  if (!parsed.success) {
    const fieldErrors = zodErrors(parsed.error);
    if (fieldErrors.token) return { linkProblem: "This invitation link is incomplete. Copy the whole link from the e-mail." };
    return { fieldErrors, values: { name } };
  }
  try {
    const { userId } = await acceptInvitation({ token: parsed.data.token, name: parsed.data.name, password: parsed.data.password });
    const c = sessionCookie(await createSession(userId), isHttps(await headers()));
    (await cookies()).set(c.name, c.value, c.attributes);
  } catch (e) {
    if (!(e instanceof AppError) || (e.status !== 404 && e.status !== 409)) throw e;
    return { linkProblem: e.status === 404 ? "We can't find this invitation any more. Ask your admin for a new one." : e.message };
  }
  // "/" sends each role to its own first page (lib/auth/home.ts)
  redirect("/");
}
