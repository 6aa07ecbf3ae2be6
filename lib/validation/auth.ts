import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email("Enter an e-mail address like name@example.com"));

export const passwordSchema = z
  .string()
  .min(10, "Use at least 10 characters")
  .max(200, "Use at most 200 characters");

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "Enter your password"),
});

export const resetRequestSchema = z.object({ email: emailSchema });

export const resetConfirmSchema = z.object({
  token: z.string().min(20, "This link is incomplete"),
  password: passwordSchema,
});

export const invitationSchema = z.object({
  email: emailSchema,
  role: z.enum(ROLES),
  name: z.string().trim().max(120).optional(),
});

export const acceptInvitationSchema = z.object({
  token: z.string().min(20, "This link is incomplete"),
  name: z.string().trim().min(1, "Enter your name").max(120),
  password: passwordSchema,
});

export const memberRoleSchema = z.object({ role: z.enum(ROLES) });

export type InvitationInput = z.infer<typeof invitationSchema>;
