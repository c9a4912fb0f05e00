// Text for HTML: every user string (cloud names, file names, the title, settings, messages)
// goes through htmlText before it reaches the page, so it shows as text and runs nothing.
#pragma once

#include <string>

namespace barrow {

/// `&`, `<`, `>`, `"` and `'` as character references (safe in text and in quoted attributes).
std::string htmlText(const std::string& s);

}  // namespace barrow
