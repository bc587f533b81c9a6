import next from "eslint-config-next";

export default [
  ...next,
  { ignores: [".next/**", ".next-test-*/**", "node_modules/**", ".data/**", "db/migrations/**", "bench/out/**"] },
];
