import { SqliteSweepStore } from '../../../src/backends/embedded/store.js'
import { storeContract } from '../../sweep/store-contract.js'
import { makeDataDir } from './helpers.js'
import { sqliteTraces } from '../../helpers/traces.js'

storeContract('SQLite (embedded backend)', async () => {
  const data = makeDataDir()
  const store = new SqliteSweepStore(data.dir)
  return {
    store,
    // The store holds its database exclusively: it is closed first (traces is a test's last look).
    traces: async (id) => {
      store.close()
      return sqliteTraces(store.path, id)
    },
    close: async () => {
      store.close()
      data.remove()
    }
  }
})
