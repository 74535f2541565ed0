import express from 'express'
import request from 'supertest'
import { describe, expect, it } from 'vitest'
import { z } from 'zod'
import { HttpError } from '../../server/http-error'
import { apiNotFound, errorHandler } from '../../server/middleware/errorHandler'

/** A tiny app whose routes fail on purpose, behind the real parser and error handler. */
function failingApp(): express.Express {
  const app = express()
  app.use(express.json({ limit: '1kb' }))
  const BrewInput = z.object({ dose: z.number().positive(), method: z.enum(['percolation', 'immersion', 'espresso']) }).strict()
  app.post('/api/v1/brews', (req, res) => {
    res.status(201).json(BrewInput.parse(req.body))
  })
  for (const [status, code] of [[401, 'unauthenticated'], [403, 'forbidden'], [404, 'not_found'], [409, 'conflict']] as const) {
    app.get(`/api/v1/fail/${status}`, () => {
      throw new HttpError(status, code, `Failed with ${status} on purpose.`)
    })
  }
  app.get('/api/v1/fail/async', async () => {
    await Promise.resolve()
    throw new Error('database exploded: secret detail')
  })
  app.use('/api', apiNotFound)
  app.use(errorHandler)
  return app
}

describe('errorHandler', () => {
  it('turns a zod failure into 400 naming the field', async () => {
    const response = await request(failingApp()).post('/api/v1/brews').send({ dose: -3, method: 'percolation' })
    expect(response.status).toBe(400)
    expect(response.body.error.code).toBe('invalid_input')
    expect(response.body.error.message).toMatch(/^dose: /)
    expect(response.body.error.issues).toEqual([expect.objectContaining({ path: 'dose' })])
  })

  it('names an unknown field', async () => {
    const response = await request(failingApp()).post('/api/v1/brews').send({ dose: 18, method: 'espresso', tdsPercent: 9.5 })
    expect(response.status).toBe(400)
    expect(JSON.stringify(response.body.error)).toContain('tdsPercent')
  })

  it.each([401, 403, 404, 409])('keeps a service\'s %i with its code and message', async (status) => {
    const response = await request(failingApp()).get(`/api/v1/fail/${status}`)
    expect(response.status).toBe(status)
    expect(response.body.error.message).toBe(`Failed with ${status} on purpose.`)
  })

  it('answers an unexpected rejection with 500 and hides its detail', async () => {
    const response = await request(failingApp()).get('/api/v1/fail/async')
    expect(response.status).toBe(500)
    expect(response.body.error.code).toBe('internal')
    expect(response.text).not.toContain('secret detail')
  })

  it('answers 413 for an oversized body', async () => {
    const response = await request(failingApp()).post('/api/v1/brews').send({ notes: 'y'.repeat(4096) })
    expect(response.status).toBe(413)
  })
})
