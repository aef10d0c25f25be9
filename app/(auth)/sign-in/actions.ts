"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { homePath } from "@/lib/auth/home";
import { isHttps, sessionCookie } from "@/lib/auth/session";
import { signIn } from "@/lib/auth/sign-in";
import { AppError } from "@/lib/http/errors";
import { signInInput } from "@/lib/validation/auth";

export interface SignInState {
  message?: string;
  fieldErrors?: { email?: string[]; password?: string[] };
  email?: string;
}

export async function signInAction(_prev: SignInState, form: FormData): Promise<SignInState> {
  const parsed = signInInput.safeParse({ email: form.get("email"), password: form.get("password") });
  const email = String(form.get("email") ?? "");
  if (!parsed.success) return { fieldErrors: z.flattenError(parsed.error).fieldErrors, email };
  let home: string;
  try {
    const { user, session } = await signIn(parsed.data);
    const c = sessionCookie(session, isHttps(await headers()));
    (await cookies()).set(c.name, c.value, c.attributes);
    home = homePath(user.role);
  } catch (e) {
    if (e instanceof AppError && (e.status === 401 || e.status === 429)) return { message: e.message, email };
    throw e;
  }
  const next = String(form.get("next") ?? "");
  redirect(next.startsWith("/") && !next.startsWith("//") ? next : home);
}
