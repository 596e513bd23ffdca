#include "core/store/postgres_connection.hpp"

#include <cstdlib>
#include <cstring>

#include <libpq-fe.h>

namespace counterpoise::store {

using validation::FileError;

namespace {

// libpq's messages end with a line break; the store's messages are one sentence.
std::string trimmed(const char* text) {
  std::string out = text ? text : "";
  while (!out.empty() && (out.back() == '\n' || out.back() == ' ')) out.pop_back();
  return out;
}

// Notices (e.g. "relation already exists, skipping") are for a console, not for the program.
void ignore_notice(void*, const char*) {}

bool is_lost_connection(const std::string& sqlstate) {
  // Class 08: connection exception; 57P01..57P03: the server is shutting down or restarting.
  return sqlstate.rfind("08", 0) == 0 || sqlstate == "57P01" || sqlstate == "57P02" ||
         sqlstate == "57P03";
}

}  // namespace

PgResult::~PgResult() {
  if (result_) PQclear(result_);
}

int PgResult::rows() const { return PQntuples(result_); }

bool PgResult::is_null(int row, int column) const { return PQgetisnull(result_, row, column) != 0; }

std::string PgResult::text(int row, int column) const {
  return std::string(PQgetvalue(result_, row, column),
                     static_cast<std::size_t>(PQgetlength(result_, row, column)));
}

std::optional<std::string> PgResult::optional_text(int row, int column) const {
  if (is_null(row, column)) return std::nullopt;
  return text(row, column);
}

std::int64_t PgResult::integer(int row, int column) const {
  return std::strtoll(PQgetvalue(result_, row, column), nullptr, 10);
}

std::string PgResult::bytes(int row, int column) const {
  if (is_null(row, column)) return {};
  std::size_t length = 0;
  unsigned char* decoded = PQunescapeBytea(
      reinterpret_cast<const unsigned char*>(PQgetvalue(result_, row, column)), &length);
  if (!decoded) throw std::bad_alloc();
  std::string out(reinterpret_cast<const char*>(decoded), length);
  PQfreemem(decoded);
  return out;
}

PgConnection::PgConnection(const std::string& connection, std::string where)
    : where_(std::move(where)) {
  // expand_dbname: the dbname value may be a whole URI or key=value string; an empty value
  // leaves every setting to the environment, the service file and libpq's defaults.
  const char* keywords[] = {"dbname", "fallback_application_name", nullptr};
  const char* values[] = {connection.c_str(), "counterpoise", nullptr};
  connection_ = PQconnectdbParams(keywords, values, 1);
  if (!connection_)
    throw FileError({}, where_ + ": cannot connect to the database (out of memory)");
  if (PQstatus(connection_) != CONNECTION_OK) {
    const std::string message = trimmed(PQerrorMessage(connection_));
    PQfinish(connection_);
    connection_ = nullptr;
    throw FileError({}, where_ + ": cannot connect to the database (" + message + ")");
  }
  PQsetNoticeProcessor(connection_, ignore_notice, nullptr);
}

PgConnection::~PgConnection() {
  if (connection_) PQfinish(connection_);
}

bool PgConnection::alive() const { return PQstatus(connection_) == CONNECTION_OK; }

void PgConnection::fail(pg_result* result) {
  const char* state = result ? PQresultErrorField(result, PG_DIAG_SQLSTATE) : nullptr;
  last_sqlstate_ = state ? state : "";
  std::string message =
      trimmed(result ? PQresultErrorField(result, PG_DIAG_MESSAGE_PRIMARY) : nullptr);
  if (message.empty()) message = trimmed(PQerrorMessage(connection_));
  if (result) PQclear(result);
  // The server gives every error it sends an SQLSTATE; an error without one is libpq's own, and
  // is the connection failing ("server closed the connection unexpectedly") even before
  // PQstatus has noticed.
  if (is_lost_connection(last_sqlstate_) || last_sqlstate_.empty() || PQstatus(connection_) != CONNECTION_OK)
    throw FileError({}, where_ + ": the connection to the database was lost (" + message +
                            "); what was being written was not committed");
  if (last_sqlstate_ == "42501")
    throw StoreAccessDenied({}, where_ + ": the database refused it (" + message + ")");
  throw FileError({}, where_ + ": the database refused it (" + message + ")");
}

PgResult PgConnection::checked(pg_result* result, const char*) {
  const ExecStatusType status = result ? PQresultStatus(result) : PGRES_FATAL_ERROR;
  if (status != PGRES_COMMAND_OK && status != PGRES_TUPLES_OK) fail(result);
  last_sqlstate_.clear();
  return PgResult(result);
}

PgResult PgConnection::run(const char* sql, const std::vector<PgParam>& params) {
  std::vector<const char*> values;
  std::vector<int> lengths, formats;
  for (const PgParam& p : params) {
    values.push_back(p.value ? p.value->data() : nullptr);
    lengths.push_back(p.value ? static_cast<int>(p.value->size()) : 0);
    formats.push_back(p.binary ? 1 : 0);
  }
  return checked(PQexecParams(connection_, sql, static_cast<int>(params.size()), nullptr,
                              values.data(), lengths.data(), formats.data(), 0),
                 sql);
}

void PgConnection::execute(const char* sql) { checked(PQexec(connection_, sql), sql); }

}  // namespace counterpoise::store
