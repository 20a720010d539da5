import { flushPromises, mount } from '@vue/test-utils'
import { describe, expect, it, vi } from 'vitest'
import { ApiError } from '@/api/http'
import AuthForm from '@/components/auth/AuthForm.vue'

function mountForm(submit: (input: { email: string; password: string }) => Promise<void>) {
  return mount(AuthForm, { props: { mode: 'signup', submit }, attachTo: document.body })
}

async function fillAndSubmit(
  wrapper: ReturnType<typeof mountForm>,
  email: string,
  password: string,
) {
  await wrapper.get('input#email').setValue(email)
  await wrapper.get('input#password').setValue(password)
  await wrapper.get('form').trigger('submit')
  await flushPromises()
}

describe('AuthForm', () => {
  it('does not submit a password shorter than the minimum', async () => {
    const submit = vi.fn(async () => {})
    const wrapper = mountForm(submit)
    await fillAndSubmit(wrapper, 'sam@example.test', 'short')
    expect(submit).not.toHaveBeenCalled()
    expect(wrapper.text()).toContain('Use at least 10 characters.')
    wrapper.unmount()
  })

  it('shows the server message under the field it names', async () => {
    const submit = vi.fn(async () => {
      throw new ApiError(409, 'email_taken', 'An account with this e-mail already exists.', {
        email: 'An account with this e-mail already exists. Sign in instead.',
      })
    })
    const wrapper = mountForm(submit)
    await fillAndSubmit(wrapper, 'sam@example.test', 'long enough password')
    expect(submit).toHaveBeenCalledWith({
      email: 'sam@example.test',
      password: 'long enough password',
    })
    expect(wrapper.text()).toContain('Sign in instead.')
    wrapper.unmount()
  })

  it('shows a message without fields in an alert', async () => {
    const wrapper = mountForm(async () => {
      throw new ApiError(
        429,
        'rate_limited',
        'Too many attempts. Wait a few minutes and try again.',
      )
    })
    await fillAndSubmit(wrapper, 'sam@example.test', 'long enough password')
    expect(wrapper.get('[role="alert"]').text()).toContain('Too many attempts')
    wrapper.unmount()
  })
})
