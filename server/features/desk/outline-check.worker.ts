import { parentPort, workerData } from 'node:worker_threads'
import { DomainError } from '../../../shared/errors'
import type { LakeGeometry } from '../../../shared/geo/types'
import { assertPlausibleShoreline, type ShorelineStats } from '../../../shared/geo/validate'
import { LakeShoreline } from '../../../shared/schemas/lake-read'

/** What a check answers: the outline and its figures, or why the file cannot be a lake. */
export type OutlineCheckAnswer =
  { ok: true; shoreline: LakeGeometry; stats: ShorelineStats } | { ok: false; message: string }

/** The geometry of an uploaded GeoJSON file: a Polygon or MultiPolygon, bare or in one Feature. */
function check(text: string): OutlineCheckAnswer {
  let doc: unknown
  try {
    doc = JSON.parse(text)
  } catch {
    return { ok: false, message: 'The file is not JSON.' }
  }
  const d = doc as { type?: string; geometry?: unknown; features?: { geometry?: unknown }[] }
  if (d?.type === 'FeatureCollection' && d.features?.length !== 1)
    return {
      ok: false,
      message: 'Upload one lake: a FeatureCollection with exactly one feature.',
    }
  const geometry =
    d?.type === 'Feature'
      ? d.geometry
      : d?.type === 'FeatureCollection'
        ? d.features![0]!.geometry
        : doc
  const parsed = LakeShoreline.safeParse(geometry)
  if (!parsed.success)
    return {
      ok: false,
      message: 'The file holds no Polygon or MultiPolygon with [longitude, latitude] positions.',
    }
  try {
    return { ok: true, shoreline: parsed.data, stats: assertPlausibleShoreline(parsed.data) }
  } catch (err) {
    if (err instanceof DomainError) return { ok: false, message: err.message }
    throw err
  }
}

parentPort!.postMessage(check(workerData as string))
