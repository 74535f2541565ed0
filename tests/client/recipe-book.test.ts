import { describe, expect, it } from 'vitest'
import { houseRecipes, recipesInOrder } from '../../src/composables/recipeBook'
import { localRecord } from './records'

const quay = localRecord('recipe', { id: 'quay', name: 'Quay filter', method: 'percolation', retired: false })
const fair = localRecord('recipe', { id: 'fair', name: 'Fair filter', method: 'percolation', retired: false })
const shot = localRecord('recipe', { id: 'shot', name: 'Fair espresso', method: 'espresso', retired: false })
const old = localRecord('recipe', { id: 'old', name: 'Autumn filter', method: 'percolation', retired: true })
const mark = (id: string, recipeId: string | null, method: 'percolation' | 'espresso', rev: number | null) => localRecord('houseRecipe', { id, method, recipeId, rev })

describe('houseRecipes', () => {
  it('lets the latest mark of each method stand, by the server\'s order, with marks not yet sent last', () => {
    const marks = [mark('m3', 'quay', 'percolation', null), mark('m2', 'fair', 'percolation', 7), mark('m1', 'quay', 'percolation', 3), mark('m4', 'shot', 'espresso', 5)]
    const house = houseRecipes(marks, [quay, fair, shot])
    expect(house.get('percolation')?.id).toBe('quay')
    expect(house.get('espresso')?.id).toBe('shot')
  })

  it('leaves a method without one when its mark was cleared or names a retired recipe or one of another method', () => {
    expect(houseRecipes([mark('a', 'quay', 'percolation', 1), mark('b', null, 'percolation', 2)], [quay]).size).toBe(0)
    expect(houseRecipes([mark('a', 'old', 'percolation', 1)], [old]).size).toBe(0)
    expect(houseRecipes([mark('a', 'shot', 'percolation', 1)], [shot]).size).toBe(0)
  })
})

describe('recipesInOrder', () => {
  it('lists the house recipes first, then the others by name, the retired last', () => {
    const house = houseRecipes([mark('a', 'quay', 'percolation', 1), mark('b', 'shot', 'espresso', 2)], [quay, fair, shot, old])
    expect(recipesInOrder([old, fair, shot, quay], house).map(r => r.id)).toEqual(['quay', 'shot', 'fair', 'old'])
  })
})
