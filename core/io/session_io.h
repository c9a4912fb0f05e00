// The session file: versioned JSON of our own schema holding both clouds, the measure
// settings, the sweep and view options. Saved atomically (temporary file + rename).
//
//   { "format": "barrow-session", "version": 1,
//     "clouds": { "A": {"name": "...", "points": [[x, y], ...], "weights": [...]}, "B": {...} },
//     "measures": { "selected": ["w1", ...], "params": {"sinkhorn.epsilon": "0.05", ...} },
//     "sweep": { "family": "shift", "direction": [1, 0], "center": null | [x, y],
//                "from": -1, "to": 1, "steps": 81, "reference": null | θ0 },
//     "view": { ...free-form GUI options... } }
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "base/params.h"
#include "cloud/cloud.h"
#include "io/atomic_write.h"
#include "io/load_error.h"
#include "sweep/sweep_settings.h"

namespace barrow {

inline constexpr int kSessionVersion = 1;

struct Session {
  Cloud a;
  Cloud b;
  std::vector<std::string> selected;  // measure ids shown; empty = all
  ParamSet params;                    // group.key = value
  SweepSettings sweep;
  nlohmann::json view = nlohmann::json::object();
};

std::string formatSession(const Session& s);
Loaded<Session> parseSession(const std::string& text, const std::string& file);
Loaded<Session> readSession(const std::string& path);
std::optional<std::string> writeSession(const std::string& path, const Session& s,
                                        const WriteFault* fault = nullptr);

}  // namespace barrow
