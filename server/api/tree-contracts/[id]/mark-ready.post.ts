import { moveNoteSchema } from '#shared/schemas/contract'

export default treeMoveRoute('mark-ready', moveNoteSchema)
