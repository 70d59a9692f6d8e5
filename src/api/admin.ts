import { UserListSchema } from '#shared/schemas/user'
import { api } from './client'

export function fetchUsers() {
  return api.get('admin/users').json().then((body) => UserListSchema.parse(body).users)
}
