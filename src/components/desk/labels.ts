import { PARAMETERS, parameterForKey, type QuarantineReason } from '@shared/readings'
import type { BriefSendStatus } from '@shared/schemas/brief'
import type { QUARANTINE_STATUSES } from '@shared/schemas/quarantine'

type QuarantineStatus = (typeof QUARANTINE_STATUSES)[number]

/** The desk's vocabulary in words: its keys are for code and filters, never for a person. */
export const QUARANTINE_REASON_LABELS: Record<QuarantineReason, string> = {
  malformed: 'Malformed row',
  unknown_unit: 'Unknown unit',
  out_of_range: 'Out of range',
  rate_of_change: 'Changed too fast',
  conflicting_duplicate: 'Conflicting duplicate',
  invalid_weather: 'Invalid weather row',
}

export const QUARANTINE_STATUS_LABELS: Record<QuarantineStatus, string> = {
  held: 'Held',
  released: 'Released',
  discarded: 'Discarded',
}

/** "Water temperature" for `water_temp`; an unknown key as it came (the row said so). */
export function parameterLabel(key: string): string {
  const parameter = parameterForKey(key)
  return parameter ? PARAMETERS[parameter].name : key
}

/** A reason of the readings import: a quarantine reason in words, other text as it is. */
export function reasonLabel(reason: string): string {
  return QUARANTINE_REASON_LABELS[reason as QuarantineReason] ?? reason
}

export const STATION_STATE_LABELS = { ok: 'Healthy', stale: 'Stale', failing: 'Failing' } as const

export const BRIEF_STATUS_LABELS: Record<BriefSendStatus, string> = {
  sending: 'Being sent',
  sent: 'Sent',
  retry: 'Waiting to retry',
  failed: 'Failed',
}

const AUDIT_ACTIONS: Record<string, string> = {
  'lake.create': 'Added a lake',
  'lake.edit': 'Edited a lake',
  'lake.shoreline': 'Replaced a lake outline',
  'quarantine.discard': 'Discarded a held reading',
  'quarantine.release': 'Released a held reading',
  'station.create': 'Added a station',
  'station.edit': 'Edited a station',
  'station.deactivate': 'Deactivated a station',
  'station.import': 'Imported readings',
  'station.run': 'Read a station now',
  'user.role': 'Changed a role',
}
/** An audit action in words; one this screen does not know yet shows as recorded. */
export const auditActionLabel = (action: string) => AUDIT_ACTIONS[action] ?? action

const TARGETS: Record<string, string> = {
  lake: 'Lake',
  station: 'Station',
  quarantine: 'Held reading',
  user: 'User',
}
export const auditTargetLabel = (type: string) => TARGETS[type] ?? type
