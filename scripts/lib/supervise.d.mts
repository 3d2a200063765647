import type { ChildProcess } from 'node:child_process'

export interface SuperviseOptions {
  baseDelayMs?: number
  maxDelayMs?: number
  maxRestarts?: number
  windowMs?: number
  killAfterMs?: number
  log?: (message: string) => void
  now?: () => number
}

export interface SuperviseResult {
  reason: 'stopped' | 'gave-up'
  code: number
  restarts: number
}

export const SUPERVISE_DEFAULTS: Required<Omit<SuperviseOptions, 'log' | 'now'>>
export function restartDelay(n: number, options?: Pick<SuperviseOptions, 'baseDelayMs' | 'maxDelayMs'>): number
export function supervise(spawnChild: () => ChildProcess, options?: SuperviseOptions): {
  stop: (signal?: NodeJS.Signals) => Promise<SuperviseResult>
  done: Promise<SuperviseResult>
  current: () => ChildProcess | null
}
