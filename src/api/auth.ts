import type { Me, PasswordChangeInput, SignInInput, SignUpInput } from '@shared/schemas/auth'
import { apiCommand, apiRequest } from './http'

export const authApi = {
  me: () => apiRequest<Me>('/me'),
  signIn: (body: SignInInput) => apiRequest<Me>('/auth/signin', { method: 'POST', body }),
  signUp: (body: SignUpInput) => apiRequest<Me>('/auth/signup', { method: 'POST', body }),
  signOut: () => apiCommand('/auth/signout'),
  changePassword: (body: PasswordChangeInput) =>
    apiRequest<Me>('/me/password', { method: 'POST', body }),
}
