import { SqliteSweepStore } from '../../../src/backends/embedded/store.js'
import { storeContract } from '../../sweep/store-contract.js'
import { makeDataDir } from './helpers.js'

storeContract('SQLite (embedded backend)', async () => {
  const data = makeDataDir()
  const store = new SqliteSweepStore(data.dir)
  return {
    store,
    close: async () => {
      store.close()
      data.remove()
    }
  }
})
