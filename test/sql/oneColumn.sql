-- Evensplit: the sign-test counts against a hypothesised median and two order statistics, for one column.
-- Reads measurements(measurement) and the one-row table median_question(hypothesised_median, lower_rank,
-- upper_rank); the ranks are those EVENSPLIT.ORDERRANKS gives for n, the number of values (this query's n).
WITH ordered AS (
  SELECT m.measurement AS x,
         ROW_NUMBER() OVER (ORDER BY m.measurement) AS order_rank
  FROM measurements m
  WHERE m.measurement IS NOT NULL
)
SELECT COUNT(*) AS n,
       SUM(CASE WHEN o.x < q.hypothesised_median THEN 1 ELSE 0 END) AS below,
       SUM(CASE WHEN o.x = q.hypothesised_median THEN 1 ELSE 0 END) AS tied,
       SUM(CASE WHEN o.x > q.hypothesised_median THEN 1 ELSE 0 END) AS above,
       MIN(CASE WHEN o.order_rank = q.lower_rank THEN o.x END) AS lower_bound,
       MIN(CASE WHEN o.order_rank = q.upper_rank THEN o.x END) AS upper_bound
FROM ordered o
CROSS JOIN median_question q
