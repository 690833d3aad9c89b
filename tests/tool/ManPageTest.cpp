//===- ManPageTest.cpp - docs/revbound.1 names every command and option ---===//
#include "ToolRunner.h"

#include <gtest/gtest.h>

#include <regex>
#include <set>

namespace revbound::test {
namespace {

class ManPage : public ToolTest {};

// Every option a subcommand's --help lists must be in the man page, so the
// page cannot fall behind the driver.
TEST_F(ManPage, ListsEveryOptionOfEveryCommand) {
  std::string Page =
      slurp(std::filesystem::path(REVBOUND_DOCS_DIR) / "revbound.1");
  ASSERT_FALSE(Page.empty()) << "docs/revbound.1 is missing";
  std::string Plain; // roff escapes dropped: "\-\-jobs" reads "--jobs"
  for (char C : Page)
    if (C != '\\')
      Plain += C;
  for (const char *Command : {"report", "compare", "check", "gates"}) {
    EXPECT_NE(Plain.find(std::string(".B revbound ") + Command),
              std::string::npos)
        << Command;
    Outcome R = invoke(std::string(Command) + " --help");
    ASSERT_EQ(R.Exit, 0) << R.Err;
    std::regex Option("--[a-z][a-z-]*");
    std::set<std::string> Seen;
    for (std::sregex_iterator It(R.Out.begin(), R.Out.end(), Option), End;
         It != End; ++It)
      Seen.insert(It->str());
    for (const std::string &O : Seen)
      if (O != "--help")
        EXPECT_NE(Plain.find(O), std::string::npos)
            << O << " of revbound " << Command << " is not in docs/revbound.1";
  }
}

} // namespace
} // namespace revbound::test
