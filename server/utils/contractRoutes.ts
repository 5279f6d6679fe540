import type { z } from 'zod'
import { idParamSchema, pageQuerySchema } from '#shared/schemas/fields'
import type { FruitContractAction, TreeContractAction } from '#shared/utils/contractStatus'
import { fruitContractHistory, getFruitContract, moveFruitContract, type FruitMoveBody } from '../services/fruitContracts'
import { getTreeContract, moveTreeContract, treeContractHistory, type TreeMoveBody } from '../services/treeContracts'

// The move routes of both kinds of contract are one shape: sign-in and role first, then the id,
// the body by the move's own schema, the move, and the contract as GET answers it.

export function treeMoveRoute(action: Exclude<TreeContractAction, 'edit'>, schema: z.ZodType) {
  return defineEventHandler(async (event) => {
    const user = await requireMember(event, ACCESS_RULES.writeContracts)
    const { id } = parseParams(event, idParamSchema)
    const body = await parseBody(event, schema) as TreeMoveBody
    await moveTreeContract(user, id, action, body)
    return getTreeContract(user, id)
  })
}

export function fruitMoveRoute(action: Exclude<FruitContractAction, 'edit' | 'fulfil'>, schema: z.ZodType) {
  return defineEventHandler(async (event) => {
    const user = await requireMember(event, ACCESS_RULES.writeContracts)
    const { id } = parseParams(event, idParamSchema)
    const body = await parseBody(event, schema) as FruitMoveBody
    await moveFruitContract(user, id, action, body)
    return getFruitContract(user, id)
  })
}

export function historyRoute(kind: 'tree' | 'fruit') {
  return defineEventHandler(async (event) => {
    const user = await requireMember(event, ACCESS_RULES.readContracts)
    const { id } = parseParams(event, idParamSchema)
    const page = parseQuery(event, pageQuerySchema)
    return kind === 'tree' ? treeContractHistory(user, id, page) : fruitContractHistory(user, id, page)
  })
}
