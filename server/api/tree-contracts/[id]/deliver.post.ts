import { treeDeliverSchema } from '#shared/schemas/contract'

export default treeMoveRoute('deliver', treeDeliverSchema)
