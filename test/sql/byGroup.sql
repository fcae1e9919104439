-- Evensplit: the same for every group at once, in one GROUP BY.
-- Reads measurements(group_label, measurement), the one-row table median_question(hypothesised_median) and
-- group_ranks(group_label, lower_rank, upper_rank): one row per group, ORDERRANKS of that group's n.
WITH ordered AS (
  SELECT m.group_label,
         m.measurement AS x,
         ROW_NUMBER() OVER (PARTITION BY m.group_label ORDER BY m.measurement) AS order_rank
  FROM measurements m
  WHERE m.measurement IS NOT NULL
)
SELECT o.group_label,
       COUNT(*) AS n,
       SUM(CASE WHEN o.x < q.hypothesised_median THEN 1 ELSE 0 END) AS below,
       SUM(CASE WHEN o.x = q.hypothesised_median THEN 1 ELSE 0 END) AS tied,
       SUM(CASE WHEN o.x > q.hypothesised_median THEN 1 ELSE 0 END) AS above,
       MIN(CASE WHEN o.order_rank = r.lower_rank THEN o.x END) AS lower_bound,
       MIN(CASE WHEN o.order_rank = r.upper_rank THEN o.x END) AS upper_bound
FROM ordered o
CROSS JOIN median_question q
LEFT JOIN group_ranks r ON r.group_label = o.group_label
GROUP BY o.group_label
ORDER BY o.group_label
