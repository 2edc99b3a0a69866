-- People who already ticked sites chose for themselves: they keep exactly what they ticked for each kind that existed
-- when they saved (a kind they left empty stays empty). Role defaults apply to people who never saved, and to the
-- re-check kind, which is newer than every saved choice.
INSERT INTO `alert_kind_choices` (`user_id`, `kind`, `all_sites`)
SELECT p.`user_id`, k.`kind`, 0
FROM (SELECT DISTINCT `user_id` FROM `alert_subscriptions`) p
CROSS JOIN (
  SELECT 'chronic' AS `kind` UNION ALL SELECT 'leak_rate' UNION ALL SELECT 'open_leak' UNION ALL SELECT 'digest'
) k;
