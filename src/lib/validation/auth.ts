import { z } from "zod";

export const email = z.string().trim().toLowerCase().max(254).pipe(z.email());

export const signInSchema = z.object({
  email,
  password: z.string().min(1).max(256),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** Length is what makes a password strong; 12 to 256 characters, anything allowed. */
export const newPasswordSchema = z
  .object({
    token: z.string().min(20).max(200),
    password: z.string().min(12).max(256),
    confirm: z.string().max(256),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "validation.passwordsDiffer" });
export type NewPasswordInput = z.infer<typeof newPasswordSchema>;

export const forgotPasswordSchema = z.object({ email });
