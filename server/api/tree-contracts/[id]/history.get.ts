export default historyRoute('tree')
