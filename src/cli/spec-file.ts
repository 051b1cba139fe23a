/** Reading a spec file and choosing an output format from a file name. */
import { readFile } from 'node:fs/promises'
import { extname } from 'node:path'
import { CliError, EXIT } from './io.js'

export async function readSpecFile (path: string): Promise<unknown> {
  let text: string
  try {
    text = await readFile(path, 'utf8')
  } catch (error) {
    throw new CliError(`Cannot read the spec file ${path}: ${(error as Error).message}`, EXIT.refused)
  }
  try {
    return JSON.parse(text)
  } catch (error) {
    throw new CliError(`${path} is not valid JSON: ${(error as Error).message}`, EXIT.refused)
  }
}

export type OutputFormat = 'csv' | 'json'

/** The format asked for, else the output file's extension (.csv or .json). */
export function outputFormat (file: string | undefined, asked: string | undefined): OutputFormat {
  if (asked !== undefined) {
    if (asked !== 'csv' && asked !== 'json') throw new CliError(`--format must be csv or json, not '${asked}'.`, EXIT.refused)
    return asked
  }
  const ext = file === undefined ? '' : extname(file).toLowerCase()
  if (ext === '.csv') return 'csv'
  if (ext === '.json' || file === undefined) return 'json'
  throw new CliError(`Cannot tell the format from '${file}': name it .csv or .json, or pass --format.`, EXIT.refused)
}
