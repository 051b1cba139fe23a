# memsweep service image: build with the dev toolchain, run on a slim image as a non-root user.
#   docker build -t memsweep .
#   docker run -p 127.0.0.1:8080:8080 -e ALLOW_ANONYMOUS=true -v memsweep-data:/data memsweep
# The API listens on 0.0.0.0 inside the container, so it starts only with TOKENS_FILE (a mounted
# tokens file) or with ALLOW_ANONYMOUS=true, as above where the port is published on loopback only.
# The same image runs a Redis worker: docker run -e REDIS_URL=redis://redis:6379 memsweep node dist/cli/main.js worker

FROM node:20-bookworm-slim AS build
WORKDIR /app
# better-sqlite3 compiles from source when no prebuilt binary matches.
RUN apt-get update && apt-get install -y --no-install-recommends python3 make g++ && rm -rf /var/lib/apt/lists/*
COPY package.json package-lock.json ./
RUN npm ci --no-audit --no-fund
COPY tsconfig.json tsconfig.build.json ./
COPY src ./src
# The web page: its sources, its build script and the examples it offers.
COPY web ./web
COPY scripts/build-web.mjs scripts/build-if-changed.mjs ./scripts/
COPY examples ./examples
RUN npm run build && npm prune --omit=dev

FROM node:20-bookworm-slim AS runtime
ENV NODE_ENV=production \
    PORT=8080 \
    HOST=0.0.0.0 \
    DATA_DIR=/data
WORKDIR /app
COPY --from=build /app/package.json ./
COPY --from=build /app/node_modules ./node_modules
COPY --from=build /app/dist ./dist
COPY openapi ./openapi
COPY examples ./examples
RUN mkdir -p /data && chown node:node /data
USER node
VOLUME ["/data"]
EXPOSE 8080
# Liveness only: /healthz checks no dependency, so a Redis outage never restarts the API.
HEALTHCHECK --interval=15s --timeout=3s --start-period=20s --retries=3 \
  CMD node -e "fetch('http://127.0.0.1:'+(process.env.PORT||8080)+'/healthz').then(r=>process.exit(r.ok?0:1),()=>process.exit(1))"
# exec form: node is PID 1's child of nothing else, so SIGTERM reaches close-with-grace.
# --single-threaded-gc: see src/runtime/node-flags.ts.
CMD ["node", "--single-threaded-gc", "dist/server.js"]
