import { z } from 'zod';
import { emailField, optionalText, patchOf, phoneField } from '../lib/records/fields.ts';
import { listQuerySchema } from '../lib/records/list-query.ts';

const ownerShape = {
  name: z.string({ required_error: 'Enter a name' }).trim().min(1, 'Enter a name').max(120),
  phone: phoneField.optional(),
  email: emailField.optional(),
  /** The owner agreed to receive texts; the time of consent is recorded on the server. */
  textConsent: z.boolean().optional(),
  notes: optionalText(2000),
};

/** A new owner (client). Phone is converted to E.164 here, on the client and on the server alike. */
export const ownerCreateSchema = z.object(ownerShape);
export type OwnerCreate = z.infer<typeof ownerCreateSchema>;

/** Changes to an owner; `archived` hides the owner from lists and pickers but keeps its history. */
export const ownerPatchSchema = patchOf(ownerShape);
export type OwnerPatch = z.infer<typeof ownerPatchSchema>;

export const ownerListQuery = listQuerySchema(['name', 'phone', 'horses', 'createdAt'], 'name');
export type OwnerListQuery = z.infer<typeof ownerListQuery>;
