import { z } from 'zod'
import { Role, User } from './auth'
import { pageOf, PageQuery } from './paging'
import { PlainText } from './text'

export const UserListQuery = PageQuery.extend({
  q: PlainText().max(254).optional(),
  role: Role.optional(),
})
export type UserListQuery = z.infer<typeof UserListQuery>

export const UserPage = pageOf(User)
export type UserPage = z.infer<typeof UserPage>

export const UserIdParams = z.object({ id: z.uuid({ error: 'Not a user id.' }) })

export const UserRoleInput = z.object({ role: Role })
export type UserRoleInput = z.infer<typeof UserRoleInput>
