import { treeTermsPatchSchema } from '#shared/schemas/contract'

export default treeMoveRoute('counter', treeTermsPatchSchema)
