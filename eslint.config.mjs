import next from "eslint-config-next";

export default [
  ...next,
  { ignores: [".next/**", "node_modules/**", ".data/**", "db/migrations/**", "bench/out/**"] },
];
