import { foundation } from './0001-foundation'
import { accounts } from './0002-accounts'
import { desk } from './0003-desk'
import { calculations } from './0004-calculations'
import { libraryStatus } from './0005-library-status'
import { inboundMail } from './0006-inbound-mail'
import { responsePacks } from './0007-response-packs'
import { priceBook } from './0008-price-book'
import { turnaroundIndexes } from './0009-turnaround-indexes'
import { remindersAndPackQuotations } from './0010-reminders-and-pack-quotations'
import { storedWorkingTimes } from './0011-stored-working-times'
import type { Migration } from './types'

/** Every migration in the order it runs. Append; never edit one that has landed. */
export const migrations: Migration[] = [foundation, accounts, desk, calculations, libraryStatus, inboundMail, responsePacks, priceBook, turnaroundIndexes, remindersAndPackQuotations, storedWorkingTimes]
