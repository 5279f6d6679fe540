import { fruitTermsPatchSchema } from '#shared/schemas/contract'

export default fruitMoveRoute('counter', fruitTermsPatchSchema)
