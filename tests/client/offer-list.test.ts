// @vitest-environment node
import { describe, expect, it } from 'vitest'
import { guessMapping, offerRows, readOfferSheet } from '../../src/forms/offerList'
import { readAltitude, readBags, readCurrency, readPriceUnit, readSheetNumber } from '../../src/forms/sheetValues'

const tripId = '0190a8c4-0000-7000-8000-0000000000dd'

// An invented offer list as a seller's spreadsheet saves it: units in headers and cells, one bad row.
const offer = [
  'Lot,Producer,Region,Altitude (masl),Variety,Process,Bags,Moisture %,aw,Density g/L,Screen,Primary defects,Secondary defects,Price (USD/lb),Notes',
  'FT-07,Fernhollow Terraces,Upper Bends,"1,650-1,800",Typica,washed,20 x 69 kg,10.9,0.55,735,16/18,0,4,4.20,Floral',
  '',
  'FT-09,Quillmoor Cooperative,Lower Bends,1500,Bourbon,natural,12,12.6 %,0.61,690,15+,2,9,"3,85",',
  'FT-11,,Upper Bends,1700,Caturra,honey,10,10.2,0.58,720,16,0,3,4.05,No farm named',
  'FT-12,Saltmarsh Ridge,Coast Hills,1400,Catuai,washed,8,108,0.5,700,15,1,5,3.10,',
].join('\r\n')

describe('readOfferSheet', () => {
  it('reads the header and the rows, with each row\'s line in the file', () => {
    const sheet = readOfferSheet(`\uFEFF${offer}`)
    expect(sheet.headers[1]).toBe('Producer')
    expect(sheet.rows.map(row => row.line)).toEqual([2, 4, 5, 6])
    expect(sheet.decimal).toBe('.')
  })

  it('sees a semicolon sheet with decimal commas', () => {
    const sheet = readOfferSheet('Finca;Humedad;Precio\nLa Vereda Alta;10,8;4,20\n')
    expect(sheet).toMatchObject({ delimiter: ';', decimal: ',' })
  })

  it.each([['', /no rows/], ['Farm,Moisture\n', /no lots under it/]])('refuses %j, saying why', (text, message) => {
    expect(() => readOfferSheet(text)).toThrow(message)
  })
})

describe('guessMapping', () => {
  it('matches columns by their headers, the longest name first, one field per column', () => {
    const mapping = guessMapping(['Lot', 'Producer', 'Bag weight (kg)', 'Lot size (kg)', 'Bags', 'Humidity', 'Price (USD/lb)', 'Comments'])
    expect(mapping).toMatchObject({ reference: 0, farm: 1, bagKg: 2, lotSizeKg: 3, bags: 4, moisturePercent: 5, askingPrice: 6, notes: 7, region: null, currency: null })
  })
})

describe('offerRows', () => {
  const sheet = readOfferSheet(offer)
  const rows = offerRows(sheet, guessMapping(sheet.headers), { tripId, decimal: '.', existing: [] })

  it('turns a good row into a lot of the trip, units and ranges read', () => {
    expect(rows[0]!.problems).toEqual([])
    expect(rows[0]!.lot).toMatchObject({
      tripId,
      reference: 'FT-07',
      farm: 'Fernhollow Terraces',
      altitudeMinM: 1650,
      altitudeMaxM: 1800,
      bags: 20,
      bagKg: 69,
      lotSizeKg: 1380,
      moisturePercent: 10.9,
      waterActivity: 0.55,
      densityGPerL: 735,
      screenSize: '16/18',
      primaryDefects: 0,
      secondaryDefects: 4,
      askingPrice: 4.2,
      currency: 'USD',
      priceUnit: 'lb',
      decision: 'open',
    })
  })

  it('keeps the rows that fail, with each reason naming its field', () => {
    // "3,85" under a decimal point is no number (never 385); a row without a farm; 108 % moisture.
    expect(rows[1]).toMatchObject({ line: 4, lot: null, problems: [{ field: 'askingPrice', label: 'Asking price', message: expect.stringMatching(/"3,85" is not a number/) }] })
    expect(rows[2]).toMatchObject({ line: 5, lot: null, problems: [{ field: 'farm', label: 'Farm or producer', message: 'must not be empty' }] })
    expect(rows[3]!.problems).toEqual([{ field: 'moisturePercent', label: 'Moisture (%)', message: 'must be below 100 %' }])
  })

  it('fails a lot already on the trip, and a lot given twice in the file', () => {
    const again = offerRows(sheet, guessMapping(sheet.headers), { tripId, decimal: '.', existing: [{ farm: 'fernhollow terraces', reference: 'FT-07' }] })
    expect(again[0]!.problems).toEqual([{ field: 'farm', label: 'Farm or producer', message: 'this lot is already on the trip' }])
    const twice = readOfferSheet('Farm,Lot\nHollin Step,A1\nHollin Step,A1\n')
    expect(offerRows(twice, guessMapping(twice.headers), { tripId, decimal: '.', existing: [] })[1]!.problems[0]!.message).toBe('this lot is on line 2 too')
  })

  it('reads decimal commas when the sheet uses them', () => {
    const european = readOfferSheet('Finca;Humedad;Precio;Moneda\nLa Vereda Alta;10,8;4,20;eur\n')
    const [row] = offerRows(european, { ...guessMapping(european.headers), farm: 0, moisturePercent: 1, askingPrice: 2, currency: 3 }, { tripId, decimal: european.decimal, existing: [] })
    expect(row!.lot).toMatchObject({ farm: 'La Vereda Alta', moisturePercent: 10.8, askingPrice: 4.2, currency: 'EUR' })
  })
})

describe('cells as people type them', () => {
  it.each([
    ['10.8 %', '.', 10.8],
    ['1,380 kg', '.', 1380],
    ['1.380,5', ',', 1380.5],
    ['USD 4.20', '.', 4.2],
    ['', '.', null],
  ] as const)('reads %j with "%s" as the decimal mark as %s', (text, decimal, value) => {
    expect(readSheetNumber(text, decimal)).toEqual({ value, error: null })
  })

  it.each([['10,8', '.'], ['1.2.3', '.'], ['n/a', '.']] as const)('refuses %j with "%s" as the decimal mark', (text, decimal) => {
    expect(readSheetNumber(text, decimal).error).toMatch(/is not a number/)
  })

  it('reads altitudes in metres or feet, single or as a range', () => {
    expect(readAltitude('1,600–1,800 masl', '.').value).toEqual({ min: 1600, max: 1800 })
    // 5,200 ft × 0.3048 m/ft = 1584.96 m.
    expect(readAltitude('5,200 ft', '.').value).toEqual({ min: 1585, max: null })
    expect(readAltitude('high', '.').error).toMatch(/not a number/)
  })

  it('reads bag counts with the weight of a bag', () => {
    expect(readBags('275 × 60kg', '.').value).toEqual({ bags: 275, bagKg: 60 })
    expect(readBags('12', '.').value).toEqual({ bags: 12, bagKg: null })
    expect(readBags('12.5', '.').error).toMatch(/whole number/)
  })

  it('finds the currency and the unit of a price', () => {
    expect(readCurrency('€7.40')).toBe('EUR')
    expect(readCurrency('4.20 per kg')).toBeNull()
    expect(readPriceUnit('4.20/lb')).toBe('lb')
    expect(readPriceUnit('per bag')).toBe('bag')
    expect(readPriceUnit('Price (USD/kg)')).toBe('kg')
    expect(readPriceUnit('whole lot')).toBe('lot')
  })
})
