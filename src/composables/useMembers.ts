import type { Ref } from 'vue'
import type { Member } from '../../shared/schemas/auth'
import { computed } from 'vue'
import { fetchMembers } from '../api/accounts'
import { db } from '../db/database'
import { useLiveQuery } from './useLiveQuery'

const key = (teamId: string | null): string => `members:${teamId}`
/**
 * Teams whose members were fetched since the app started: every screen that names people uses
 * this composable, and one fetch per team and visit is enough.
 */
const fetched = new Set<string>()

/** Fetches the team's members and keeps them on the phone, so names show offline too. */
export async function refreshMembers(teamId: string): Promise<void> {
  await rememberMembers(teamId, await fetchMembers(teamId))
}

/** Keeps a member list fetched elsewhere (the members screen) as the phone's copy. */
export async function rememberMembers(teamId: string, members: Member[]): Promise<void> {
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
  if (teamId.value && navigator.onLine && !fetched.has(teamId.value)) {
    const team = teamId.value
    fetched.add(team)
    // Offline or refused: the copy on the phone stays, and the next screen tries again.
    void refreshMembers(team).catch(() => fetched.delete(team))
  }
  return { members, nameOf, whoOf }
}
