import type { Ref } from 'vue'
import type { Member } from '../../shared/schemas/auth'
import { computed } from 'vue'
import { fetchMembers } from '../api/accounts'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

const key = (teamId: string | null): string => `members:${teamId}`

/** Fetches the team's members and keeps them on the phone, so names show offline too. */
export async function refreshMembers(teamId: string): Promise<void> {
  const members = await fetchMembers(teamId)
  await db.meta.put({ key: key(teamId), value: members.map(({ userId, name, role }) => ({ userId, name, role })) })
}

/**
 * Who is who on the team, for "recorded by" lines: from the copy kept on the phone, refreshed
 * from the server when there is signal.
 */
export function useMembers(teamId: Ref<string | null>, me: Ref<{ id: string, name: string } | null>) {
  const { value: members } = useLiveQuery(async () => ((await db.meta.get(key(teamId.value)))?.value ?? []) as Pick<Member, 'userId' | 'name' | 'role'>[], [], teamId)
  const names = computed(() => new Map(members.value.map(member => [member.userId, member.name])))
  /** A person's name, for records and exports. */
  function nameOf(userId: string): string {
    return names.value.get(userId) ?? (userId === me.value?.id ? me.value.name : 'a former or unknown member')
  }
  /** "you" for the person holding the phone, their name for anyone else. */
  const whoOf = (userId: string): string => (userId === me.value?.id ? 'you' : nameOf(userId))
  if (teamId.value && navigator.onLine)
    void refreshMembers(teamId.value).catch(() => {})
  return { members, nameOf, whoOf }
}
