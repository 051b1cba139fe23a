import { rename, writeFile } from 'node:fs/promises'

/** Writes via a temporary file and a rename, so a reader never sees half a result. */
export async function writeFileAtomically (path: string, content: string | Uint8Array): Promise<void> {
  const temporary = `${path}.${process.pid}.partial`
  await writeFile(temporary, content)
  await rename(temporary, path)
}
