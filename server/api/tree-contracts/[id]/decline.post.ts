import { moveNoteSchema } from '#shared/schemas/contract'

export default treeMoveRoute('decline', moveNoteSchema)
