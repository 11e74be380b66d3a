-- Trigram indexes for the atlas search's "part of a name or summary" (SQLite FTS5 trigram
-- tokenizer, which serves LIKE '%…%' of three or more characters). External-content tables over
-- maps.summary and models.name, kept in step by triggers; the search still applies its LIKE.
CREATE VIRTUAL TABLE `maps_trigrams` USING fts5(summary, content='maps', content_rowid='rowid', tokenize='trigram');
--> statement-breakpoint
INSERT INTO `maps_trigrams` (rowid, summary) SELECT rowid, summary FROM `maps`;
--> statement-breakpoint
CREATE TRIGGER `maps_trigrams_ai` AFTER INSERT ON `maps` BEGIN
  INSERT INTO `maps_trigrams` (rowid, summary) VALUES (new.rowid, new.summary);
END;
--> statement-breakpoint
CREATE TRIGGER `maps_trigrams_ad` AFTER DELETE ON `maps` BEGIN
  INSERT INTO `maps_trigrams` (`maps_trigrams`, rowid, summary) VALUES ('delete', old.rowid, old.summary);
END;
--> statement-breakpoint
CREATE TRIGGER `maps_trigrams_au` AFTER UPDATE OF summary ON `maps` BEGIN
  INSERT INTO `maps_trigrams` (`maps_trigrams`, rowid, summary) VALUES ('delete', old.rowid, old.summary);
  INSERT INTO `maps_trigrams` (rowid, summary) VALUES (new.rowid, new.summary);
END;
--> statement-breakpoint
CREATE VIRTUAL TABLE `models_trigrams` USING fts5(name, content='models', content_rowid='rowid', tokenize='trigram');
--> statement-breakpoint
INSERT INTO `models_trigrams` (rowid, name) SELECT rowid, name FROM `models`;
--> statement-breakpoint
CREATE TRIGGER `models_trigrams_ai` AFTER INSERT ON `models` BEGIN
  INSERT INTO `models_trigrams` (rowid, name) VALUES (new.rowid, new.name);
END;
--> statement-breakpoint
CREATE TRIGGER `models_trigrams_ad` AFTER DELETE ON `models` BEGIN
  INSERT INTO `models_trigrams` (`models_trigrams`, rowid, name) VALUES ('delete', old.rowid, old.name);
END;
--> statement-breakpoint
CREATE TRIGGER `models_trigrams_au` AFTER UPDATE OF name ON `models` BEGIN
  INSERT INTO `models_trigrams` (`models_trigrams`, rowid, name) VALUES ('delete', old.rowid, old.name);
  INSERT INTO `models_trigrams` (rowid, name) VALUES (new.rowid, new.name);
END;
