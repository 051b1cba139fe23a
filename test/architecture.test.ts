/**
 * The shape of src/, checked on the resolved import graph: no import cycles (type-only
 * imports aside), and the layer table of eslint.config.js, so that a boundary holds even
 * where a lint pattern could miss an unusual path.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { dirname, join, relative, resolve } from 'node:path'
import ts from 'typescript'
import { describe, expect, it } from 'vitest'

const SRC = resolve(import.meta.dirname, '../src')

/** Which top-level folders of src/ each may import (besides itself). */
const MAY_IMPORT: Record<string, readonly string[]> = {
  engine: [],
  spec: ['engine'],
  results: ['engine', 'spec'],
  figures: ['engine', 'spec', 'results'],
  runtime: [],
  sweep: ['engine', 'spec', 'results', 'runtime'],
  backends: ['engine', 'spec', 'results', 'runtime', 'sweep']
}

function sourceFiles (dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    if (statSync(path).isDirectory()) return sourceFiles(path)
    return path.endsWith('.ts') && !path.endsWith('.d.ts') ? [path] : []
  })
}

/** Value imports (and re-exports) of a file, resolved to files of src/. */
function valueImports (file: string): string[] {
  const source = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.ES2022, true)
  const targets: string[] = []
  for (const statement of source.statements) {
    let specifier: ts.Expression | undefined
    if (ts.isImportDeclaration(statement) && statement.importClause?.isTypeOnly !== true) specifier = statement.moduleSpecifier
    if (ts.isExportDeclaration(statement) && !statement.isTypeOnly) specifier = statement.moduleSpecifier
    if (specifier === undefined || !ts.isStringLiteral(specifier) || !specifier.text.startsWith('.')) continue
    if (ts.isImportDeclaration(statement)) {
      const bindings = statement.importClause?.namedBindings
      const onlyTypes = statement.importClause?.name === undefined && bindings !== undefined && ts.isNamedImports(bindings) &&
        bindings.elements.length > 0 && bindings.elements.every((element) => element.isTypeOnly)
      if (onlyTypes) continue
    }
    const target = resolve(dirname(file), specifier.text.replace(/\.js$/, '.ts'))
    targets.push(target)
  }
  return targets
}

const files = sourceFiles(SRC)
const graph = new Map(files.map((file) => [file, valueImports(file)]))
const layerOf = (file: string): string => relative(SRC, file).split('/')[0]!

describe('architecture of src/', () => {
  it('has no import cycles', () => {
    // Tarjan's strongly connected components: any component with more than one file is a cycle.
    let index = 0
    const indices = new Map<string, number>()
    const low = new Map<string, number>()
    const stack: string[] = []
    const onStack = new Set<string>()
    const cycles: string[][] = []
    const connect = (file: string): void => {
      indices.set(file, index)
      low.set(file, index++)
      stack.push(file)
      onStack.add(file)
      for (const next of graph.get(file) ?? []) {
        if (!graph.has(next)) continue
        if (!indices.has(next)) {
          connect(next)
          low.set(file, Math.min(low.get(file)!, low.get(next)!))
        } else if (onStack.has(next)) {
          low.set(file, Math.min(low.get(file)!, indices.get(next)!))
        }
      }
      if (low.get(file) === indices.get(file)) {
        const component: string[] = []
        let member: string
        do {
          member = stack.pop()!
          onStack.delete(member)
          component.push(relative(SRC, member))
        } while (member !== file)
        if (component.length > 1) cycles.push(component.sort())
      }
    }
    for (const file of files) if (!indices.has(file)) connect(file)
    expect(cycles).toEqual([])
  })

  it('keeps every layer to the folders it may import', () => {
    const violations: string[] = []
    for (const [file, targets] of graph) {
      const allowed = MAY_IMPORT[layerOf(file)]
      if (allowed === undefined) continue
      for (const target of targets) {
        const layer = layerOf(target)
        if (layer !== layerOf(file) && !allowed.includes(layer)) violations.push(`${relative(SRC, file)} → ${relative(SRC, target)}`)
      }
    }
    expect(violations).toEqual([])
  })

  it('lets the API reach backends only through the queue port', () => {
    const violations = [...graph].flatMap(([file, targets]) => layerOf(file) !== 'api'
      ? []
      : targets.filter((target) => /\/backends\/(embedded|redis)\//.test(target)).map((target) => `${relative(SRC, file)} → ${relative(SRC, target)}`))
    expect(violations).toEqual([])
  })
})
