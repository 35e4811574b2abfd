# One image for web, worker and migrations; the compose file picks the command.
FROM node:20-bookworm-slim
WORKDIR /app
COPY package.json package-lock.json ./
COPY analysis-worker/package.json analysis-worker/
COPY analysis-worker/engine/package.json analysis-worker/engine/
COPY db/package.json db/
COPY seed-demo/package.json seed-demo/
COPY web/package.json web/
COPY tests/package.json tests/
RUN npm ci --no-audit --no-fund
COPY . .
RUN DATABASE_URL=postgres://build@localhost/none node node_modules/next/dist/bin/next build --webpack web
EXPOSE 3000
