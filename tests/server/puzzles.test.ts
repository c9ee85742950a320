import { describe, expect, it } from 'vitest'
import { useApiSuite } from '../helpers/api'
import { draftOf, fixture, withoutSolution } from '../helpers/studio'

const api = useApiSuite()
const as = api.as
const puzzles = () => `/api/channels/${api.channelId}/puzzles`
const create = (id = 'PE01', extra = {}) => api.createPuzzle(draftOf(id, extra))

describe('POST /api/channels/:channelId/puzzles', () => {
  it('should save a classic puzzle as unique with its solution, and fill in the optional fields', async () => {
    const res = await as('presenter').post(puzzles(), draftOf('PE01'))
    expect(res.status).toBe(201)
    expect(res.body).toEqual({
      id: expect.any(Number),
      channelId: api.channelId,
      title: 'Project Euler 96 Grid 01',
      author: '',
      check: 'unique',
      outlineCount: 0,
      staleOutlineCount: 0,
      version: 1,
      updatedAt: expect.any(String),
      givens: fixture('PE01').givens,
      thermometers: [],
      link: '',
      publishedOn: '',
      notes: '',
      problems: [],
    })
    const row = await api.db('puzzles').where({ id: res.body.id }).first()
    expect(row!.solution).toBe(fixture('PE01').solution)
    expect(row!.created_by).toBe(api.user('presenter').id)
  })

  it('should save a thermometer puzzle as unique, with cell names in lower case and 0 read as empty', async () => {
    const gt = fixture('GT13')
    const shouting = gt.thermometers!.map((path) => path.map((c) => c.toUpperCase()))
    const res = await as('owner').post(puzzles(), {
      title: 'Four Fevers',
      author: 'Ilse Marchetti',
      givens: gt.givens.replaceAll('.', '0'),
      thermometers: shouting,
      link: 'https://puzzles.example/four-fevers',
      publishedOn: '2026-11-30',
      notes: 'Break-in on the long thermometer.',
    })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      check: 'unique',
      givens: gt.givens,
      thermometers: gt.thermometers,
      author: 'Ilse Marchetti',
      link: 'https://puzzles.example/four-fevers',
      publishedOn: '2026-11-30',
      notes: 'Break-in on the long thermometer.',
    })
    expect((await api.db('puzzles').where({ id: res.body.id }).first())!.solution).toBe(gt.solution)
  })

  it('should save a draft with more than one solution, naming two cells where solutions differ', async () => {
    const res = await as('owner').post(puzzles(), draftOf('PE01', { givens: fixture('PE01').givens.slice(0, 9) + '.'.repeat(72) }))
    expect(res.status).toBe(201)
    expect(res.body.check).toBe('multiple-solutions')
    expect(res.body.problems).toEqual([{ code: 'multiple-solutions', message: expect.stringMatching(/more than one solution/), cells: [expect.any(Number), expect.any(Number)] }])
    expect((await api.db('puzzles').where({ id: res.body.id }).first())!.solution).toBeNull()
  })

  it('should save a draft without a solution', async () => {
    const res = await as('owner').post(puzzles(), draftOf('PE01', { givens: withoutSolution(fixture('PE01')) }))
    expect(res.status).toBe(201)
    expect(res.body.check).toBe('no-solution')
    expect(res.body.problems[0]).toMatchObject({ code: 'no-solution', message: expect.stringMatching(/no solution/) })
  })

  it('should save a draft that breaks the rules as invalid, with the engine messages and cells', async () => {
    const givens = '1...1' + '.'.repeat(76) // the same digit twice in row 1, in two different boxes
    const res = await as('owner').post(puzzles(), { title: 'Twins', givens, thermometers: [['r5c5']] })
    expect(res.status).toBe(201)
    expect(res.body.check).toBe('invalid')
    expect(res.body.problems.map((p: { code: string }) => p.code).sort()).toEqual(['duplicate-given', 'thermometer-too-short'])
    expect(res.body.problems.find((p: { code: string }) => p.code === 'duplicate-given').cells).toEqual([0, 4])
  })

  const invalid: { label: string; body: object; field: string; message: RegExp }[] = [
    { label: 'givens of the wrong length', body: { givens: '123' }, field: 'body.givens', message: /81 characters/ },
    { label: 'a letter in the givens', body: { givens: 'x' + '.'.repeat(80) }, field: 'body.givens', message: /each 1-9 or '\.'/ },
    { label: 'a bad cell name', body: { thermometers: [['r1c1', 'r0c2']] }, field: 'body.thermometers.0.1', message: /named like r3c4/ },
    { label: 'a link that is not an address', body: { link: 'my blog' }, field: 'body.link', message: /web address/ },
    { label: 'a script link', body: { link: 'javascript:alert(1)' }, field: 'body.link', message: /web address/ },
    { label: 'a date that does not exist', body: { publishedOn: '2026-02-30' }, field: 'body.publishedOn', message: /YYYY-MM-DD/ },
    { label: 'a date in another format', body: { publishedOn: '30/11/2026' }, field: 'body.publishedOn', message: /YYYY-MM-DD/ },
    { label: 'an empty title', body: { title: '  ' }, field: 'body.title', message: /title must not be empty/ },
  ]
  for (const { label, body, field, message } of invalid) {
    it(`should answer 400 naming ${field} for ${label}`, async () => {
      const res = await as('owner').post(puzzles(), { ...draftOf('PE01'), ...body })
      expect(res.status).toBe(400)
      expect(res.body.code).toBe('invalid-input')
      expect(res.body.message).toMatch(new RegExp(`^${field.replaceAll('.', '\\.')}: `))
      expect(res.body.message).toMatch(message)
      expect(res.body.details[0].path).toBe(field)
    })
  }
})

describe('GET /api/channels/:channelId/puzzles', () => {
  it('should list summaries, most recently saved first, with their outline counts', async () => {
    const older = await create('PE02')
    const newer = await create('GT13')
    const res = await as('editor').get(puzzles())
    expect(res.status).toBe(200)
    const ids = res.body.map((p: { id: number }) => p.id)
    expect(ids.indexOf(newer.id)).toBeLessThan(ids.indexOf(older.id))
    expect(res.body.find((p: { id: number }) => p.id === newer.id)).toEqual({
      id: newer.id,
      channelId: api.channelId,
      title: newer.title,
      author: '',
      check: 'unique',
      outlineCount: 0,
      staleOutlineCount: 0,
      version: 1,
      updatedAt: newer.updatedAt,
    })
  })
})

describe('GET /api/channels/:channelId/puzzles/:puzzleId', () => {
  it('should return the record as it was saved', async () => {
    const saved = await create('WIKI1')
    const res = await as('editor').get(`${puzzles()}/${saved.id}`)
    expect(res.body).toEqual(saved)
  })

  it('should answer 400 for an id that is not a number', async () => {
    const res = await as('owner').get(`${puzzles()}/first`)
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('params.puzzleId: must be a positive whole number')
  })

  it('should answer 404 for a puzzle of another channel, even to its owner', async () => {
    const elsewhere = await api.ownersOtherChannel()
    const foreign = await api.createPuzzle(draftOf('PE03'), elsewhere)
    const path = `${puzzles()}/${foreign.id}`
    for (const res of [
      await as('owner').get(path),
      await as('owner').put(path, { ...draftOf('PE03'), version: 1 }),
      await as('owner').delete(path),
    ]) {
      expect(res.status).toBe(404)
      expect(res.body.message).toBe('Puzzle not found')
    }
    expect(await api.db('puzzles').where({ id: foreign.id }).first()).toMatchObject({ title: foreign.title, version: 1 })
  })
})

describe('PUT /api/channels/:channelId/puzzles/:puzzleId', () => {
  it('should save a new version and check the puzzle again', async () => {
    const saved = await create('PE01')
    const res = await as('owner').put(`${puzzles()}/${saved.id}`, { ...draftOf('PE01'), givens: '.'.repeat(81), version: 1 })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ id: saved.id, version: 2, check: 'multiple-solutions', givens: '.'.repeat(81) })
    expect((await api.db('puzzles').where({ id: saved.id }).first())!.solution).toBeNull()
  })

  it('should answer 409 with the current copy to the second of two people who read the same version, losing nothing', async () => {
    const saved = await create('PE01')
    const path = `${puzzles()}/${saved.id}`
    const readByOwner = (await as('owner').get(path)).body
    const readByPresenter = (await as('presenter').get(path)).body
    expect(readByOwner.version).toBe(1)
    expect(readByPresenter.version).toBe(1)

    const first = await as('owner').put(path, { ...draftOf('PE01'), title: 'Owner title', notes: 'owner notes', version: readByOwner.version })
    expect(first.status).toBe(200)
    const second = await as('presenter').put(path, { ...draftOf('PE01'), title: 'Presenter title', version: readByPresenter.version })
    expect(second.status).toBe(409)
    expect(second.body).toMatchObject({ code: 'stale', message: expect.stringMatching(/^Someone saved a newer version/) })
    expect(second.body.details.current).toEqual(first.body)
    expect((await as('editor').get(path)).body).toEqual(first.body)

    // the presenter saves again on top of the current version
    const retry = await as('presenter').put(path, { ...draftOf('PE01'), title: 'Presenter title', notes: 'owner notes', version: second.body.details.current.version })
    expect(retry.status).toBe(200)
    expect(retry.body).toMatchObject({ title: 'Presenter title', notes: 'owner notes', version: 3 })
  })

  it('should require the version that was read', async () => {
    const saved = await create('PE01')
    const res = await as('owner').put(`${puzzles()}/${saved.id}`, draftOf('PE01'))
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^body\.version: /)
  })
})

describe('DELETE /api/channels/:channelId/puzzles/:puzzleId', () => {
  it('should remove the puzzle and its outlines', async () => {
    const saved = await create('GT13')
    await api.db('outlines').insert({ puzzle_id: saved.id, name: 'Take 1', status: 'solved', step_count: 0, total_ms: 0, document: api.db.raw("'{}'::jsonb"), script: api.db.raw("'{}'::jsonb") })
    const res = await as('presenter').delete(`${puzzles()}/${saved.id}`)
    expect(res.status).toBe(204)
    expect((await as('owner').get(`${puzzles()}/${saved.id}`)).status).toBe(404)
    expect(await api.db('outlines').where({ puzzle_id: saved.id })).toEqual([])
  })
})
