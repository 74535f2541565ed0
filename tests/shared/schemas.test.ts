import { describe, expect, it } from 'vitest'
import { entityDataSchemas } from '../../shared/schemas/entities'
import { freeText, IdSchema, textProblem } from '../../shared/schemas/primitives'
import { recordSchemaOf } from '../../shared/schemas/records'

const envelope = { id: '0190a8c4-0000-7000-8000-000000000001', teamId: '0190a8c4-0000-7000-8000-0000000000aa', createdBy: '0190a8c4-0000-7000-8000-000000000002', createdAt: '2026-12-01T08:00:00.000Z', updatedAt: '2026-12-01T08:00:00.000Z', rev: 4, deletedAt: null }

describe('text a database can store', () => {
  // Unicode 15, section 3.9: a high surrogate must be followed by a low one (D91), and U+0000 is a
  // control character (General Category Cc).
  it.each([
    ['a lone high surrogate', 'Heat \uD800 1', /surrogate/],
    ['a lone low surrogate', '\uDC00', /surrogate/],
    ['a NUL', 'K\u00007', /NUL/],
    ['a bell', 'K\u00077', /control/],
  ])('refuses %s, saying why', (_what, value, reason) => {
    expect(textProblem(value)).toMatch(reason)
    expect(freeText(100).safeParse(value).error?.issues[0]?.message).toMatch(reason)
  })

  it.each([['a pair of surrogates (an emoji)', 'Cup ☕ 🌋'], ['tabs and line breaks', 'line one\n\tline two\r\n'], ['accented letters', 'Café São Tomé']])('keeps %s', (_what, value) => {
    expect(textProblem(value)).toBeNull()
  })
})

describe('ids', () => {
  it('compare case-insensitively: they are read in lower case', () => {
    expect(IdSchema.parse('0190A8C4-0000-7000-8000-0000000000AA')).toBe('0190a8c4-0000-7000-8000-0000000000aa')
    expect(IdSchema.safeParse('not-an-id').success).toBe(false)
  })
})

describe('a reading', () => {
  // Water reads nD 1.33299 at 20 °C (ICUMSA table, row 0); no refractometer shows nD 5.67 or 1.2.
  it.each([[1.33299, 'nD', true], [5.67, 'nD', false], [1.2, 'nD', false], [-0.02, 'tds', true], [1e308, 'tds', false], [-3, 'brix', false], [9.5, 'tds', true]] as const)('of %s %s is accepted: %s', (value, kind, ok) => {
    const parsed = entityDataSchemas.reading.safeParse({ brewId: envelope.id, value, kind, takenAt: envelope.createdAt })
    expect(parsed.success).toBe(ok)
    if (!ok)
      expect(parsed.error?.issues[0]?.path).toEqual(['value'])
  })
})

describe('recordSchemaOf', () => {
  it('reads a record the server sent, with the defaults of fields it does not carry', () => {
    const record = recordSchemaOf('instrument').parse({ ...envelope, label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, derived: null })
    expect(record).toMatchObject({ label: 'Bar pen', notes: '', brixFactor: null, history: [], historyCount: 0, rev: 4 })
  })

  it('leaves out fields a newer server added, rather than refusing the record', () => {
    const record = recordSchemaOf('instrument').parse({ ...envelope, label: 'Bar pen', readingKind: 'tds', resolution: 0.01, repeatability: 0.02, derived: null, comesLater: 'x' })
    expect(record).not.toHaveProperty('comesLater')
  })

  it('refuses a record whose data does not fit its entity', () => {
    expect(recordSchemaOf('brew').safeParse({ ...envelope, label: 'Bar pen' }).success).toBe(false)
  })
})

describe('a lot stored before the grading fields existed', () => {
  it('reads with their defaults, and keeps what it had', () => {
    const old = { ...envelope, tripId: null, farm: 'Alder Ridge Estate', region: 'North Terraces', variety: 'Typica', process: 'washed', moisturePercent: 10.8, lotSizeKg: 1380, askingPrice: 7.4, currency: 'EUR', notes: '' }
    const lot = recordSchemaOf('lot').parse(old)
    expect(lot).toMatchObject({ farm: 'Alder Ridge Estate', moisturePercent: 10.8, decision: 'open', priceUnit: 'kg', bags: null, waterActivity: null, screenSize: '', decisionReason: '' })
  })

  it('and a brew context without a cupping table stays as it was', () => {
    expect(entityDataSchemas.brew.shape.context.parse({ kind: 'lot', refId: envelope.id })).toEqual({ kind: 'lot', refId: envelope.id })
  })
})
