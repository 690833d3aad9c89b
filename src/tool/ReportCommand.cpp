//===- ReportCommand.cpp - `revbound report FILE...` ----------------------===//
#include "Commands.h"

#include "revbound/report/Writers.h"

#include <memory>

namespace revbound::tool {

std::function<int()> setupReport(CLI::App &Cmd) {
  struct Options {
    InputOptions Input;
    std::string Format = "text";
    std::string Output;
  };
  auto O = std::make_shared<Options>();
  addInputOptions(Cmd, O->Input);
  Cmd.add_option("--format", O->Format, "text or json")
      ->check(CLI::IsMember({"text", "json"}))
      ->capture_default_str();
  Cmd.add_option("-o,--output", O->Output, "write the report here instead of stdout");
  return [O] {
    report::Report R;
    int Status = analyzeAll(O->Input, R);
    if (Status != ExitOk)
      return Status;
    std::string Text = O->Format == "json" ? report::writeJson(R)
                                           : report::writeText(R);
    return writeOutput(O->Output, Text);
  };
}

} // namespace revbound::tool
