import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

const config = [
  ...nextVitals,
  ...nextTs,
  {
    ignores: [".next/**", ".data/**", "node_modules/**", "next-env.d.ts", "tests/artifacts/**", "public/sw.js"],
  },
  {
    rules: {
      "@typescript-eslint/no-explicit-any": "error",
      "@typescript-eslint/ban-ts-comment": "error",
    },
  },
  {
    // Client code never reaches the database.
    files: ["components/**/*.{ts,tsx}", "lib/client/**/*.{ts,tsx}", "**/*.client.tsx"],
    rules: {
      "no-restricted-imports": ["error", { patterns: ["@/db/*", "@/db", "knex", "pg"] }],
    },
  },
  {
    // The engine is pure.
    files: ["lib/waterbalance/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: ["@/db/*", "@/app/*", "@/components/*", "node:*", "fs", "path", "knex", "pg"] },
      ],
    },
  },
];

export default config;
