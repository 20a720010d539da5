import type {
  Me,
  PasswordChangeInput,
  SignInInput,
  SignUpInput,
  SignUpSent,
} from '@shared/schemas/auth'
import { apiCommand, apiRequest } from './http'

export const authApi = {
  me: () => apiRequest<Me>('/me'),
  signIn: (body: SignInInput) => apiRequest<Me>('/auth/signin', { method: 'POST', body }),
  signUp: (body: SignUpInput) => apiRequest<SignUpSent>('/auth/signup', { method: 'POST', body }),
  confirmSignUp: (token: string) =>
    apiRequest<Me>('/auth/signup/confirm', { method: 'POST', body: { token } }),
  signOut: () => apiCommand('/auth/signout'),
  changePassword: (body: PasswordChangeInput) =>
    apiRequest<Me>('/me/password', { method: 'POST', body }),
}
