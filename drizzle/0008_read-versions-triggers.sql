-- Read-cache versions (db/schema.ts readVersions, server/read-cache): each write that can change
-- who an actor is (a person's row, memberships, tokens; a workspace's name) or what an atlas read
-- returns (models, maps, chains) bumps a counter in the same transaction, so a process that cached
-- an actor or a response sees the change at its next request, whichever process wrote it.
-- The model list's order (modelOrder in db/queries/models.ts) as an index, so that a page is read
-- off it instead of sorting the workspace (drizzle-kit splits an expression index at its commas).
CREATE INDEX `models_workspace_order_idx` ON `models` (`workspace_id`, (`rule` IS NULL), coalesce(`rule`, -1), `name`, `id`);
--> statement-breakpoint
CREATE TRIGGER `read_versions_users_au` AFTER UPDATE OF email, name ON `users` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || new.id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_users_ad` AFTER DELETE ON `users` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || old.id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_memberships_ai` AFTER INSERT ON `memberships` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || new.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_memberships_au` AFTER UPDATE OF role, user_id, workspace_id ON `memberships` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || old.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || new.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_memberships_ad` AFTER DELETE ON `memberships` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || old.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_api_tokens_au` AFTER UPDATE OF revoked_at, role, user_id, workspace_id, token_hash ON `api_tokens` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || old.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || new.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_api_tokens_ad` AFTER DELETE ON `api_tokens` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('user:' || old.user_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_workspaces_au` AFTER UPDATE OF slug, name ON `workspaces` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('ws:' || new.id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_workspaces_ad` AFTER DELETE ON `workspaces` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('ws:' || old.id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_models_ai` AFTER INSERT ON `models` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_models_au` AFTER UPDATE ON `models` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_models_ad` AFTER DELETE ON `models` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_maps_ai` AFTER INSERT ON `maps` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_maps_au` AFTER UPDATE ON `maps` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_maps_ad` AFTER DELETE ON `maps` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_chains_ai` AFTER INSERT ON `chains` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_chains_au` AFTER UPDATE ON `chains` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || new.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
--> statement-breakpoint
CREATE TRIGGER `read_versions_chains_ad` AFTER DELETE ON `chains` BEGIN
  INSERT INTO `read_versions` (scope, version) VALUES ('atlas:' || old.workspace_id, 1) ON CONFLICT (scope) DO UPDATE SET version = version + 1;
END;
