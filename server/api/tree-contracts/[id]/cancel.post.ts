import { moveNoteSchema } from '#shared/schemas/contract'

export default treeMoveRoute('cancel', moveNoteSchema)
