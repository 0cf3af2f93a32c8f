# Shared by db.sh and cluster.sh: the databases and accounts of a private instance, as SQL.
# The owner account (DB_USER) migrates, seeds and backs up; the app account (DB_APP_USER) starts
# with no privileges and scripts/migrate.ts grants it table by table.
# shellcheck shell=bash
DB_NAME=${DB_NAME:-spanproof}
DB_TEST_NAME=${DB_TEST_NAME:-spanproof_test}
DB_USER=${DB_USER:-spanproof}
DB_PASSWORD=${DB_PASSWORD:-spanproof-local}
DB_APP_USER=${DB_APP_USER:-spanproof_app}
DB_APP_PASSWORD=${DB_APP_PASSWORD:-spanproof-app-local}
accounts_sql() {
  cat <<SQL
CREATE DATABASE IF NOT EXISTS \`$DB_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE DATABASE IF NOT EXISTS \`$DB_TEST_NAME\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
CREATE USER IF NOT EXISTS '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
ALTER USER '$DB_USER'@'127.0.0.1' IDENTIFIED BY '$DB_PASSWORD';
GRANT ALL PRIVILEGES ON \`$DB_NAME\`.* TO '$DB_USER'@'127.0.0.1' WITH GRANT OPTION;
GRANT ALL PRIVILEGES ON \`$DB_TEST_NAME\`.* TO '$DB_USER'@'127.0.0.1' WITH GRANT OPTION;
-- Tests that need a database of their own name it spanproof_<something>.
GRANT ALL PRIVILEGES ON \`spanproof\\_%\`.* TO '$DB_USER'@'127.0.0.1' WITH GRANT OPTION;
CREATE USER IF NOT EXISTS '$DB_APP_USER'@'127.0.0.1' IDENTIFIED BY '$DB_APP_PASSWORD';
ALTER USER '$DB_APP_USER'@'127.0.0.1' IDENTIFIED BY '$DB_APP_PASSWORD';
SQL
}
