# lapwright HTTP service. Two stages: build with the full toolchain, then run with production
# dependencies only, as the unprivileged `node` user of the base image.
#   docker build -t lapwright .
#   docker run --rm -p 8080:8080 lapwright
# No container daemon in CI: `npm run docker:check` replays these steps in a clean copy.

FROM node:20-slim AS build
WORKDIR /app
COPY package.json package-lock.json ./
# scripts off: "prepare" would build before the sources are here
RUN npm ci --ignore-scripts --no-audit --no-fund
COPY tsconfig.json tsconfig.build.json ./
COPY src ./src
RUN npm run build
RUN npm prune --omit=dev --no-audit --no-fund

FROM node:20-slim AS runtime
ENV NODE_ENV=production HOST=0.0.0.0 PORT=8080
WORKDIR /app
COPY --from=build /app/package.json ./package.json
COPY --from=build /app/node_modules ./node_modules
COPY --from=build /app/dist ./dist
COPY bin ./bin
COPY openapi ./openapi
USER node
EXPOSE 8080
# slim has no curl: node's fetch asks /healthz
HEALTHCHECK --interval=15s --timeout=3s --start-period=10s --retries=3 CMD ["node", "-e", "fetch('http://127.0.0.1:' + (process.env.PORT || 8080) + '/healthz').then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))"]
# what `npm start` runs, without npm in between, so SIGTERM reaches the server directly
CMD ["node", "dist/src/server/main.js"]
