import type { ResultsEmailResponse } from '../../shared/schemas/results'
import { ResultsEmailResponseSchema } from '../../shared/schemas/results'
import { api, apiText } from './client'

/** A round's results as the team server works them out, as CSV text. */
export const fetchResultsCsv = (teamId: string, roundId: string): Promise<string> => apiText(`/teams/${teamId}/rounds/${roundId}/results.csv`)

/** Sends a signed-off round's results to an address, with the CSV attached. */
export function emailResults(teamId: string, roundId: string, to: string): Promise<ResultsEmailResponse> {
  return api('POST', `/teams/${teamId}/rounds/${roundId}/results/email`, { body: { to }, schema: ResultsEmailResponseSchema })
}
