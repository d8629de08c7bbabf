import { z } from 'zod';

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(254),
  password: z.string().min(1, 'Enter your password').max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** A new password: long enough to resist guessing, short enough to hash quickly. */
export const passwordSchema = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const acceptInviteSchema = z.object({
  token: z.string().min(10).max(100),
  name: z.string().trim().min(1, 'Enter your name').max(120).optional(),
  password: passwordSchema,
});

export const inviteSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(254),
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role: z.enum(['lead', 'dispatcher', 'farrier']),
  farrierId: z.number().int().positive().nullable().optional(),
});
export type InviteInput = z.infer<typeof inviteSchema>;
