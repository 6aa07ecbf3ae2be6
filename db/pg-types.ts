import pg from "pg";

// Dates stay ISO local dates ('2026-11-30'): parsing them into a JS Date would shift them by the
// server's time zone. Numeric and bigint columns hold values well inside double precision.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number.parseFloat(v));
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));
