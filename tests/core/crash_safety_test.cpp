// The drawing survives: a save or an autosave killed at any moment leaves a file that is
// either the previous version or the new one, whole, byte for byte; a write that fails (the
// disk full) reports the file and the reason and keeps the previous file. The processes
// that save are forked children killed with SIGKILL at varying moments (as a crash or a
// power cut would stop them), so nothing in them gets to clean up.
#include <gtest/gtest.h>
#include <signal.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <filesystem>
#include <functional>
#include <thread>

#include "io/session_io.h"
#include "support/test_support.h"

namespace barrow {
namespace {

// Version k of an edited session: k extra points in A (so every version has its own bytes)
// and a B large enough (5 000 points, ~250 KB of JSON) that a save takes a while.
Session version(int k) {
  Session s;
  s.a = test::gaussianCloud(3 + k, 7, 0.0, 1.0);
  s.a.points(0, 0) = k;  // read back to tell which version a file holds
  s.b = test::gaussianCloud(5000, 11, 2.0, 1.0);
  s.view["edit"] = k;
  return s;
}

int versionOf(const std::string& text) {
  const auto s = parseSession(text, "check");
  return s ? int(s.value->a.points(0, 0)) : -1;
}

// A killed save cannot remove its temporary file (path.tmp-N); tidy them up here.
void removeLeftovers(const std::string& path) {
  const std::filesystem::path p(path);
  for (const auto& e : std::filesystem::directory_iterator(p.parent_path()))
    if (e.path().filename().string().rfind(p.filename().string() + ".tmp-", 0) == 0)
      std::filesystem::remove(e.path());
}

// Forks a child running `body` (which never returns) and kills it after `delay`.
void runAndKill(const std::function<void()>& body, std::chrono::microseconds delay) {
  const pid_t pid = fork();
  if (pid == 0) {
    body();
    _exit(0);
  }
  std::this_thread::sleep_for(delay);
  kill(pid, SIGKILL);
  int status = 0;
  waitpid(pid, &status, 0);
}

TEST(CrashSafetyTest, KillDuringSaveLeavesOnePreviousOrNewVersionWhole) {
  const std::string path = test::tempPath("killed_save.json");
  ASSERT_FALSE(writeSession(path, version(0)));
  int seenNew = 0;
  for (int round = 0; round < 12; ++round) {
    const std::string before = test::readText(path);
    const int prev = versionOf(before);
    ASSERT_GE(prev, 0);
    // The child saves versions prev+1, prev+2, ... as fast as it can.
    runAndKill([&] {
      for (int k = prev + 1;; ++k) writeSession(path, version(k));
    }, std::chrono::milliseconds(5 + (37 * round) % 400));
    const std::string after = test::readText(path);
    const int k = versionOf(after);
    ASSERT_GE(k, prev) << "round " << round << ": the file no longer parses";
    EXPECT_EQ(after, formatSession(version(k))) << "round " << round;
    if (k > prev) ++seenNew;
  }
  // Some kills should land after a completed save; if none did, the test proved little.
  EXPECT_GT(seenNew, 0);
  removeLeftovers(path);
}

TEST(CrashSafetyTest, KillDuringEditingLeavesTheLastAutosaveByteForByte) {
  const std::string path = test::tempPath("killed_edit.recovery.json");
  int checked = 0;
  for (int round = 0; round < 6; ++round) {
    std::remove(path.c_str());
    int fds[2];
    ASSERT_EQ(pipe(fds), 0);
    // The child edits and autosaves after each edit, then reports the version it saved.
    runAndKill([&] {
      close(fds[0]);
      for (int k = 1;; ++k) {
        Session s = version(k);  // the edit
        if (!writeSession(path, s)) (void)!write(fds[1], &k, sizeof k);
      }
    }, std::chrono::milliseconds(50 + 70 * round));
    close(fds[1]);
    int k = 0, last = 0;
    while (read(fds[0], &k, sizeof k) == sizeof k) last = k;
    close(fds[0]);
    const std::string onDisk = test::readText(path);
    if (last == 0 && onDisk.empty()) continue;  // killed before the first autosave ended
    const int found = versionOf(onDisk);
    // The last reported autosave, or the one after it when the kill fell between the
    // rename and the report.
    EXPECT_TRUE(found == last || found == last + 1) << "round " << round << ": " << found << " vs " << last;
    EXPECT_EQ(onDisk, formatSession(version(found)));
    // What a restore reads writes back to the same bytes.
    const auto restored = readSession(path);
    ASSERT_TRUE(restored) << restored.error.text();
    EXPECT_EQ(formatSession(*restored.value), onDisk);
    ++checked;
  }
  EXPECT_GT(checked, 0) << "no autosave finished before any kill";
  removeLeftovers(path);
}

// A full disk, for real: the file-size limit makes write() fail with EFBIG part-way through
// the temporary file, as ENOSPC would. The previous file stays as it was.
TEST(CrashSafetyTest, FullDiskOnSaveNamesFileAndReasonAndKeepsThePreviousFile) {
  const std::string path = test::tempPath("full_disk.json");
  const Session small = version(0);
  Session big = version(5);
  ASSERT_FALSE(writeSession(path, small));
  const std::string before = test::readText(path);
  int fds[2];
  ASSERT_EQ(pipe(fds), 0);
  const pid_t pid = fork();
  if (pid == 0) {
    close(fds[0]);
    signal(SIGXFSZ, SIG_IGN);  // get EFBIG from write() instead of the signal
    const rlimit limit{200000, 200000};
    setrlimit(RLIMIT_FSIZE, &limit);
    const auto e = writeSession(path, big);
    const std::string msg = e ? *e : "";
    (void)!write(fds[1], msg.data(), msg.size());
    _exit(0);
  }
  close(fds[1]);
  std::string msg;
  char buf[512];
  for (ssize_t n; (n = read(fds[0], buf, sizeof buf)) > 0;) msg.append(buf, std::size_t(n));
  close(fds[0]);
  waitpid(pid, nullptr, 0);
  EXPECT_EQ(msg.rfind(path + ": write failed: ", 0), 0u) << msg;
  EXPECT_NE(msg.find("too large"), std::string::npos) << msg;  // strerror(EFBIG)
  EXPECT_EQ(test::readText(path), before);
}

}  // namespace
}  // namespace barrow
