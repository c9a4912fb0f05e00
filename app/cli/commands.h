// One function per barrow-cli command; each takes the arguments after the command name and
// returns the exit code (or throws InputError / InternalError / UsageError).
#pragma once

#include <string>
#include <vector>

namespace barrow::cli {

int runMeasure(const std::vector<std::string>& argv);
int runPlan(const std::vector<std::string>& argv);
int runSweep(const std::vector<std::string>& argv);
int runFindings(const std::vector<std::string>& argv);
int runDemo(const std::vector<std::string>& argv);

}  // namespace barrow::cli
