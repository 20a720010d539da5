import { describe, expect, it } from 'vitest'
import { groupCommit } from '../../../server/features/ingest/group-commit'
import type { PageCommit } from '../../../server/features/ingest/ingest.repo'

const page = (id: string) => ({ ds: { id } }) as unknown as PageCommit
const ids = (pages: PageCommit[]) => pages.map((p) => p.ds.id)

describe('groupCommit', () => {
  it('sends pages that arrive while the lanes are busy together in the next commit', async () => {
    const commits: string[][] = []
    let release!: () => void
    const gate = new Promise<void>((r) => (release = r))
    const commit = groupCommit(async (pages) => {
      commits.push(ids(pages))
      if (commits.length === 1) await gate
    }, 1)
    const first = commit([page('a')])
    const rest = [commit([page('b')]), commit([page('c'), page('d')])]
    release()
    await Promise.all([first, ...rest])
    expect(commits).toEqual([['a'], ['b', 'c', 'd']])
  })

  it('fails every caller whose pages were in a failed commit, and only those', async () => {
    const commit = groupCommit(async (pages) => {
      if (ids(pages).includes('bad')) throw new Error('constraint')
    }, 1)
    const first = commit([page('ok')])
    const batch = [commit([page('bad')]), commit([page('neighbour')])]
    await expect(first).resolves.toBeUndefined()
    for (const p of batch) await expect(p).rejects.toThrow('constraint')
    await expect(commit([page('later')])).resolves.toBeUndefined()
  })
})
