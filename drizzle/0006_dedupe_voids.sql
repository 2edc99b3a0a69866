-- Before each entry may be voided only once (unique key in the next migration): concurrent voids of one entry left
-- extra void markers. They strike out the same entry, so the earliest is kept and the repeats go; the figures do not
-- change (an entry is voided or not).
DELETE e FROM `events` e
JOIN (
  SELECT `voids_event_id`, MIN(`id`) AS `keep_id`
  FROM `events`
  WHERE `voids_event_id` IS NOT NULL
  GROUP BY `voids_event_id`
  HAVING COUNT(*) > 1
) d ON d.`voids_event_id` = e.`voids_event_id`
WHERE e.`id` <> d.`keep_id`;
