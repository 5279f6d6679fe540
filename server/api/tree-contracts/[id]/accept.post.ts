import { acceptSchema } from '#shared/schemas/contract'

export default treeMoveRoute('accept', acceptSchema)
