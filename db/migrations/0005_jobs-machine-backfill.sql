-- Jobs made before jobs named their machine get the shop's first machine (issue 12: "default
-- the shop's first machine"): the unarchived one with the lowest id, else any; jobs of a shop
-- with no machine keep none. A job's last-changed time is kept: naming the default is not an edit.
UPDATE `jobs` SET `machine_id` = (
  SELECT `m`.`id` FROM `machines` `m`
  WHERE `m`.`shop_id` = `jobs`.`shop_id`
  ORDER BY (`m`.`archived_at` IS NOT NULL), `m`.`id`
  LIMIT 1
), `updated_at` = `updated_at` WHERE `machine_id` IS NULL;
