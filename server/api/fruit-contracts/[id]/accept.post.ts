import { acceptSchema } from '#shared/schemas/contract'

export default fruitMoveRoute('accept', acceptSchema)
