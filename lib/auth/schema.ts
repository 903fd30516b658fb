import { z } from 'zod';

// Shared by the sign-up and sign-in forms and by the handlers behind them.
export const emailField = z.string().trim().toLowerCase().email('Enter a valid e-mail address.').max(254, 'That e-mail address is too long.');
export const passwordField = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

const zipField = z.string().trim().regex(/^\d{5}$/, 'Enter a 5-digit US ZIP code.');

export const signUpSchema = z.discriminatedUnion('role', [
  z.object({
    role: z.literal('rider'),
    name: z.string().trim().min(2, 'Enter your name.').max(80, 'Use at most 80 characters.'),
    email: emailField,
    password: passwordField,
  }),
  z.object({
    role: z.literal('builder'),
    name: z.string().trim().min(2, 'Enter your name.').max(80, 'Use at most 80 characters.'),
    email: emailField,
    password: passwordField,
    shopName: z.string().trim().min(2, 'Enter the shop name.').max(80, 'Use at most 80 characters.'),
    zip: zipField,
  }),
]);
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({ email: emailField, password: z.string().min(1, 'Enter your password.').max(200) });
export const emailLinkSchema = z.object({ email: emailField });
