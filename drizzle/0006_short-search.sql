-- Word indexes for search terms of one or two characters, which the trigram indexes (0005) cannot
-- serve: SQLite FTS5's unicode61 tokenizer splits names and summaries into words, and prefix='1 2'
-- keeps an index of every word's first one and two characters, so "a word begins with q" is an
-- index lookup. External-content tables over maps.summary and models.name, kept in step by triggers.
CREATE VIRTUAL TABLE `maps_words` USING fts5(summary, content='maps', content_rowid='rowid', tokenize='unicode61 remove_diacritics 0', prefix='1 2');
--> statement-breakpoint
INSERT INTO `maps_words` (`maps_words`) VALUES ('rebuild');
--> statement-breakpoint
CREATE TRIGGER `maps_words_ai` AFTER INSERT ON `maps` BEGIN
  INSERT INTO `maps_words` (rowid, summary) VALUES (new.rowid, new.summary);
END;
--> statement-breakpoint
CREATE TRIGGER `maps_words_ad` AFTER DELETE ON `maps` BEGIN
  INSERT INTO `maps_words` (`maps_words`, rowid, summary) VALUES ('delete', old.rowid, old.summary);
END;
--> statement-breakpoint
CREATE TRIGGER `maps_words_au` AFTER UPDATE OF summary ON `maps` BEGIN
  INSERT INTO `maps_words` (`maps_words`, rowid, summary) VALUES ('delete', old.rowid, old.summary);
  INSERT INTO `maps_words` (rowid, summary) VALUES (new.rowid, new.summary);
END;
--> statement-breakpoint
CREATE VIRTUAL TABLE `models_words` USING fts5(name, content='models', content_rowid='rowid', tokenize='unicode61 remove_diacritics 0', prefix='1 2');
--> statement-breakpoint
INSERT INTO `models_words` (`models_words`) VALUES ('rebuild');
--> statement-breakpoint
CREATE TRIGGER `models_words_ai` AFTER INSERT ON `models` BEGIN
  INSERT INTO `models_words` (rowid, name) VALUES (new.rowid, new.name);
END;
--> statement-breakpoint
CREATE TRIGGER `models_words_ad` AFTER DELETE ON `models` BEGIN
  INSERT INTO `models_words` (`models_words`, rowid, name) VALUES ('delete', old.rowid, old.name);
END;
--> statement-breakpoint
CREATE TRIGGER `models_words_au` AFTER UPDATE OF name ON `models` BEGIN
  INSERT INTO `models_words` (`models_words`, rowid, name) VALUES ('delete', old.rowid, old.name);
  INSERT INTO `models_words` (rowid, name) VALUES (new.rowid, new.name);
END;
