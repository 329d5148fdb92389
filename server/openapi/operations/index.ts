// Every documented route, in the order the API page shows their groups.
import type { ApiOperation } from '../registry'
import { accountOperations } from './account.operations'
import { dataOperations } from './data.operations'
import { groupsOperations } from './groups.operations'
import { runsOperations } from './runs.operations'
import { sweepsOperations } from './sweeps.operations'

export const API_OPERATIONS: readonly ApiOperation[] = [...runsOperations, ...sweepsOperations, ...dataOperations, ...groupsOperations, ...accountOperations]
