import { forgetOfflineAnswers } from '@/offline/forget'
import { acceptHMRUpdate, defineStore } from 'pinia'
import { computed, ref } from 'vue'
import { roleAllows } from '@shared/roles'
import type { Role, SignInInput, SignUpInput, User } from '@shared/schemas/auth'
import { authApi } from '@/api/auth'
import { ApiError } from '@/api/http'

export const useAuthStore = defineStore('auth', () => {
  const user = ref<User | null>(null)
  /** Whether /api/me has been asked once since the page loaded. */
  const checked = ref(false)

  const signedIn = computed(() => user.value !== null)
  const can = (role: Role) => user.value !== null && roleAllows(user.value.role, role)

  async function load() {
    try {
      user.value = (await authApi.me()).user
    } catch (err) {
      if (!(err instanceof ApiError) || err.status !== 401) throw err
      user.value = null
    } finally {
      checked.value = true
    }
  }

  /** The user the server served the page to (see PageBoot): no /api/me needed. */
  function adopt(served: User | null) {
    user.value = served
    checked.value = true
  }

  async function signIn(input: SignInInput) {
    user.value = (await authApi.signIn(input)).user
  }

  /** Mails a link that makes the account (or tells the address it has one); signs no one in. */
  async function signUp(input: SignUpInput) {
    return (await authApi.signUp(input)).sentTo
  }

  /** Opens the mailed link: the account is made and signed in. */
  async function confirmSignUp(token: string) {
    user.value = (await authApi.confirmSignUp(token)).user
  }

  async function signOut() {
    await authApi.signOut()
    user.value = null
    // What the service worker kept for reading offline was this person's: not the next one's.
    await forgetOfflineAnswers()
  }

  return { user, checked, signedIn, can, load, adopt, signIn, signUp, confirmSignUp, signOut }
})

if (import.meta.hot) import.meta.hot.accept(acceptHMRUpdate(useAuthStore, import.meta.hot))
