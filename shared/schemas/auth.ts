import { z } from 'zod'
import { ROLES } from '../roles'

export const Role = z.enum(ROLES)
export type Role = z.infer<typeof Role>

export const PASSWORD_MIN_LENGTH = 10

export const Email = z
  .string({ error: 'Enter your e-mail address.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(254))

const NewPassword = z
  .string({ error: 'Enter a password.' })
  .min(PASSWORD_MIN_LENGTH, {
    error: `Use at least ${PASSWORD_MIN_LENGTH} characters for your password.`,
  })
  .max(200, { error: 'Use at most 200 characters for your password.' })

export const SignUpInput = z.object({ email: Email, password: NewPassword })
export type SignUpInput = z.infer<typeof SignUpInput>

/** What sign-up answers, whether or not the address has an account: where the mail went. */
export const SignUpSent = z.object({ sentTo: z.string() })
export type SignUpSent = z.infer<typeof SignUpSent>

/** The token of the link a sign-up mails, which makes the account. */
export const SignUpConfirmInput = z.object({
  token: z.string({ error: 'The link is incomplete.' }).min(16).max(4000),
})
export type SignUpConfirmInput = z.infer<typeof SignUpConfirmInput>

export const SignInInput = z.object({
  email: Email,
  password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }),
})
export type SignInInput = z.infer<typeof SignInInput>

export const PasswordChangeInput = z.object({
  currentPassword: z.string().min(1, { error: 'Enter your current password.' }),
  newPassword: NewPassword,
})
export type PasswordChangeInput = z.infer<typeof PasswordChangeInput>

/** What the API ever says about a user: never a hash, never a token. */
export const User = z.object({
  id: z.uuid(),
  email: z.string(),
  role: Role,
  createdAt: z.iso.datetime(),
})
export type User = z.infer<typeof User>

export const Me = z.object({ user: User })
export type Me = z.infer<typeof Me>
