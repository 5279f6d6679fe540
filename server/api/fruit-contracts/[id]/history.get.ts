export default historyRoute('fruit')
