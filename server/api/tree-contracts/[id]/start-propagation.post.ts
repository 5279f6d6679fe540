import { moveNoteSchema } from '#shared/schemas/contract'

export default treeMoveRoute('start-propagation', moveNoteSchema)
