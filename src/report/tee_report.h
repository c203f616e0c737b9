// The T-network sweep and search as a text table, a Markdown section for a
// design note, CSV (RFC 4180: one header record, SI numbers, units in the
// column names, CRLF) and JSON (keys carry their unit). Text, Markdown and
// CSV render the same tables (report/tee_tables.h). Every figure comes from
// the full-engine budgets in the results.
//
// Markdown: a "## T-network sweep: <stage>" (or "search") heading, a list
// with temperature, band, the gain kept or targeted and what was swept or
// searched, the table (one row per network), and the notes under it. Text
// from the stage file is escaped (report/text_escape.h).
#ifndef HUSHGAIN_REPORT_TEE_REPORT_H_
#define HUSHGAIN_REPORT_TEE_REPORT_H_

#include <string>

#include "design/tee_search.h"
#include "design/tee_sweep.h"
#include "report/tee_tables.h"

namespace hushgain {

std::string SweepToText(const TeeSweepResult& sweep);
std::string SweepToCsv(const TeeSweepResult& sweep);
std::string SweepToJson(const TeeSweepResult& sweep);
std::string SweepToMarkdown(const TeeSweepResult& sweep);

std::string SearchToText(const TeeSearchResult& search,
                         const TeeSearchQuery& query);
std::string SearchToCsv(const TeeSearchResult& search,
                        const TeeSearchQuery& query);
std::string SearchToJson(const TeeSearchResult& search,
                         const TeeSearchQuery& query);
std::string SearchToMarkdown(const TeeSearchResult& search,
                             const TeeSearchQuery& query);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEE_REPORT_H_
