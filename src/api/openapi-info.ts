/** The fixed parts of the OpenAPI document: title, description, tags, security scheme. */
export const API_DOCUMENT_INFO = {
  info: {
    title: 'memsweep',
    version: '1',
    description: [
      'Simulation sweeps of Hopfield-type associative-memory networks: submit a sweep spec, follow its progress, fetch results as JSON or CSV.',
      '',
      'Errors are RFC 9457 problem documents (`application/problem+json`) with a stable `code`; docs/errors.md lists every code.',
      'When the server is configured with tokens, every route except /healthz, /readyz and the pages (the lab\'s page at /, this reference at /docs) needs `Authorization: Bearer <token>`, and each token sees only its owner\'s sweeps.'
    ].join('\n'),
    license: { name: 'MIT', identifier: 'MIT' }
  },
  servers: [{ url: '/', description: 'The server this document was fetched from.' }],
  tags: [
    { name: 'sweeps', description: 'Submit, follow, cancel and download sweeps.' },
    { name: 'theory', description: 'Mean-field and exact values without simulation.' },
    { name: 'operations', description: 'Health, readiness, metrics and this document.' }
  ],
  components: {
    securitySchemes: {
      bearerToken: { type: 'http' as const, scheme: 'bearer', description: 'A token from the server\'s TOKENS_FILE (only when the server has one).' }
    }
  },
  security: [{ bearerToken: [] }]
}
