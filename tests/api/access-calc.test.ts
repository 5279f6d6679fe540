import { accessTable } from '../support/access'

// The calculators are public: every caller, signed in or not, of any organisation or none, gets an answer.
const EVERYONE = {
  anonymous: 200,
  growerOwner: 200,
  growerMember: 200,
  grower2Owner: 200,
  makerOwner: 200,
  makerViewer: 200,
  maker2Owner: 200,
  admin: 200,
}

accessTable('public calculators', [
  { route: 'GET /api/calc/sugar?brix=12', expect: EVERYONE },
  { route: 'GET /api/calc/sugar?sg=1.050&method=hall', expect: EVERYONE },
  { route: 'GET /api/calc/alcohol?og=1.050&fg=1.000', expect: EVERYONE },
  { route: 'GET /api/calc/acid?value=6&as=tartaric', expect: EVERYONE },
  { route: 'GET /api/calc/acid?naohMl=7.5&normality=0.1&sampleMl=10&as=malic', expect: EVERYONE },
  { route: 'GET /api/calc/class?taGPerL=4.8&tanninGPerL=2.3', expect: EVERYONE },
  { route: 'GET /api/calc/planting?inRowM=3&betweenRowM=5', expect: EVERYONE },
  { route: 'GET /api/calc/planting?inRowFt=10&betweenRowFt=16', expect: EVERYONE },
  { route: 'GET /api/calc/backplan?deliveryYear=2028&season=autumn&trees=500&takePct=85&survivalPct=90', expect: EVERYONE },
])
