import { rand } from './model'

/** Faults that spoil a whole response. */
export const REQUEST_FAULTS = ['http500', 'http503', 'slow', 'truncated', 'malformed'] as const
/** Faults that spoil some observations in an otherwise good response. */
export const ITEM_FAULTS = ['duplicate', 'implausible', 'gap', 'out-of-order'] as const
export type RequestFault = (typeof REQUEST_FAULTS)[number]
export type ItemFault = (typeof ITEM_FAULTS)[number]
export type FaultKind = RequestFault | ItemFault | 'disappeared'

export interface FaultPlan {
  /** Chance that a request gets one of the enabled request faults. */
  requestRate: number
  /** Chance that an observation gets one of the enabled item faults. */
  itemRate: number
  kinds: FaultKind[]
  /** How long a slow answer takes, milliseconds. */
  slowMs: number
  /** Added to every answer, faulty or not: a distant or busy feed. */
  latencyMs: number
}

export const NO_FAULTS: FaultPlan = {
  requestRate: 0,
  itemRate: 0,
  kinds: [],
  slowMs: 0,
  latencyMs: 0,
}

/** Draws faults in a repeatable order and counts every one it injects. */
export class FaultInjector {
  plan: FaultPlan = NO_FAULTS
  readonly injected = new Map<FaultKind, number>()
  private draws = 0

  constructor(private readonly seed: number) {}

  count(kind: FaultKind, n = 1): void {
    this.injected.set(kind, (this.injected.get(kind) ?? 0) + n)
  }

  get total(): number {
    return [...this.injected.values()].reduce((a, b) => a + b, 0)
  }

  private pick<K extends FaultKind>(rate: number, kinds: readonly K[]): K | null {
    if (rate <= 0) return null
    const enabled = kinds.filter((k) => this.plan.kinds.includes(k))
    const r = rand(this.seed, 99, this.draws++)
    if (!enabled.length || r >= rate) return null
    return enabled[Math.floor(rand(this.seed, 98, this.draws++) * enabled.length)]!
  }

  /** A request fault for this request: forced by `?fault=` or drawn from the plan. */
  forRequest(forced?: string): RequestFault | null {
    if (forced && (REQUEST_FAULTS as readonly string[]).includes(forced))
      return forced as RequestFault
    return this.pick(this.plan.requestRate, REQUEST_FAULTS)
  }

  forItem(forced?: string): ItemFault | null {
    if (forced && (ITEM_FAULTS as readonly string[]).includes(forced)) return forced as ItemFault
    return this.pick(this.plan.itemRate, ITEM_FAULTS)
  }
}
