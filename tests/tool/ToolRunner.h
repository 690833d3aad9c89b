//===- ToolRunner.h - Runs the revbound executable as a user would --------===//
#ifndef REVBOUND_TESTS_TOOL_TOOLRUNNER_H
#define REVBOUND_TESTS_TOOL_TOOLRUNNER_H

#include <gtest/gtest.h>

#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <sys/wait.h>
#include <unistd.h>

namespace revbound::test {

struct Outcome {
  int Exit = -1;
  std::string Out, Err;
};

inline std::string slurp(const std::filesystem::path &P) {
  std::ifstream In(P, std::ios::binary);
  std::stringstream S;
  S << In.rdbuf();
  return S.str();
}

/// A fixture with a fresh folder per test, in which revbound runs.
class ToolTest : public ::testing::Test {
protected:
  void SetUp() override {
    Dir = std::filesystem::temp_directory_path() /
          ("revbound-tool-" + std::to_string(::getpid()) + "-" +
           ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::remove_all(Dir);
    std::filesystem::create_directories(Dir);
  }
  void TearDown() override { std::filesystem::remove_all(Dir); }

  std::filesystem::path write(const std::string &Name, const std::string &Text) {
    std::filesystem::path P = Dir / Name;
    std::ofstream(P, std::ios::binary) << Text;
    return P;
  }

  /// Runs revbound with `Args` (a shell fragment) in Dir.
  Outcome invoke(const std::string &Args, const std::string &Stdin = "") {
    std::filesystem::path In = write("stdin.txt", Stdin);
    std::string Cmd = "cd '" + Dir.string() + "' && '" REVBOUND_BINARY "' " +
                      Args + " <'" + In.string() + "' >'" +
                      (Dir / "out.txt").string() + "' 2>'" +
                      (Dir / "err.txt").string() + "'";
    int Status = std::system(Cmd.c_str());
    Outcome R;
    R.Exit = WIFEXITED(Status) ? WEXITSTATUS(Status) : -1;
    R.Out = slurp(Dir / "out.txt");
    R.Err = slurp(Dir / "err.txt");
    return R;
  }

  std::filesystem::path Dir;
};

} // namespace revbound::test

#endif
