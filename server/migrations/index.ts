import { foundation } from './0001-foundation'
import { accounts } from './0002-accounts'
import type { Migration } from './types'

/** Every migration in the order it runs. Append; never edit one that has landed. */
export const migrations: Migration[] = [foundation, accounts]
