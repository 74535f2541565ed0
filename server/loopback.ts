/**
 * Whether a host name or address reaches only this machine: `localhost`, 127.0.0.0/8 and ::1
 * (bare, or in brackets as in a URL). `0.0.0.0` and `::` mean every interface, so they are not.
 */
export function isLoopback(host: string): boolean {
  const name = host.toLowerCase()
  return name === 'localhost' || name === '::1' || name === '[::1]' || /^127(?:\.\d{1,3}){3}$/.test(name)
}
