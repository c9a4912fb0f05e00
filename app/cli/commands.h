// One function per barrow-cli command; each takes the arguments after the command name and
// returns the exit code (or throws InputError / InternalError / UsageError).
#pragma once

#include <cstdio>
#include <string>
#include <vector>

namespace barrow {
struct Cloud;
struct SweepRequest;
struct SweepResult;
}  // namespace barrow

namespace barrow::cli {

class CliArgs;

int runMeasure(const std::vector<std::string>& argv);
int runPlan(const std::vector<std::string>& argv);
int runSweep(const std::vector<std::string>& argv);
int runFindings(const std::vector<std::string>& argv);
int runDemo(const std::vector<std::string>& argv);
int runReport(const std::vector<std::string>& argv);
int runSpread(const std::vector<std::string>& argv);
int runPermute(const std::vector<std::string>& argv);
int runSizes(const std::vector<std::string>& argv);
int runCritic(const std::vector<std::string>& argv);

// Shared by sweep, findings and demo (defined in cmd_sweep.cpp).
const std::vector<std::string>& sweepOptionNames();  // valued options that describe a sweep
SweepResult sweepFromArgs(const CliArgs& args);       // loads the clouds, runs, throws on bad input
SweepResult runSweepWithProgress(const Cloud& a, const Cloud& b, const SweepRequest& req);
void printSweepNotes(const SweepResult& r, std::FILE* to);  // measures that failed somewhere
void printSweepFrame(const SweepResult& r, std::FILE* to);  // reference θ0, resolution, budget

/// The help of one command (sweep, findings, plan), or "" for commands without their own.
std::string commandHelp(const std::string& command);

}  // namespace barrow::cli
