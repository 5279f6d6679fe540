import { moveNoteSchema } from '#shared/schemas/contract'

export default fruitMoveRoute('decline', moveNoteSchema)
