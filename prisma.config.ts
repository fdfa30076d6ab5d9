// Prisma CLI configuration. The native schema engine cannot be downloaded on our machines;
// `prisma generate|validate|format` work offline with this stand-in (a real engine wins).
import { defineConfig } from "prisma/config";

process.env.PRISMA_SCHEMA_ENGINE_BINARY ??= "/bin/false";
process.env.CHECKPOINT_DISABLE ??= "1";

export default defineConfig({
  schema: "prisma/schema.prisma",
  migrations: { path: "prisma/migrations" },
  datasource: { url: process.env.DATABASE_URL ?? "postgresql://localhost:5432/heatbook" },
});
