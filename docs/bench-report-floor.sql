-- The SQL floor of the report benchmark (docs/benchmarks.md): per-reading aggregates, yield, failure Pareto.
SELECT name, unit, count(*), avg(value), sqrt(avg(value*value) - avg(value)*avg(value)), min(value), max(value),
       sum(verdict = 'fail') FROM readings GROUP BY name, unit;
SELECT count(*), sum(verdict = 'pass'), sum(verdict = 'fail'), sum(verdict = 'error') FROM runs;
SELECT first_failing_reading, count(*) FROM runs WHERE verdict <> 'pass' GROUP BY 1 ORDER BY 2 DESC;
