import { z } from "zod";
import { email, newPassword } from "./common";

export const signInInput = z.object({
  email,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200),
});
export type SignInInput = z.infer<typeof signInInput>;

export const passwordResetRequestInput = z.object({ email });

export const passwordResetConfirmInput = z.object({
  token: z.string().min(10, "The link is incomplete.").max(200),
  password: newPassword,
});

export const invitationAcceptInput = z.object({
  token: z.string().min(10, "The link is incomplete.").max(200),
  name: z.string().trim().min(1, "Enter your name.").max(120).optional(),
  password: newPassword,
});
