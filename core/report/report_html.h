// The report page: one self-contained HTML file. Everything is inline — the data block
// (report_data.h), the style, the script that draws the figures as SVG from that data — and
// a Content-Security-Policy forbids every load, so the file opens offline and fetches nothing.
// Tables and text are written here as static HTML (readable without the script and in
// print); the figures, the θ slider and its readouts are drawn by the page's script.
#pragma once

#include <optional>
#include <string>

#include "report/report_input.h"

namespace barrow {

std::string formatReportHtml(const ReportInput& in);
/// Atomic write; returns the reason on failure.
std::optional<std::string> writeReportHtml(const std::string& path, const ReportInput& in);

/// The page's style sheet and script (report_page_style.cpp, report_page_script.cpp).
const char* reportPageStyle();
const char* reportPageScript();

}  // namespace barrow
