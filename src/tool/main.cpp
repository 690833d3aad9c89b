//===- main.cpp - The revbound command-line driver ------------------------===//
//
// A table of subcommands over the library; each builds its options and makes
// library calls. Exit codes are mapped here and nowhere else.
//
//===----------------------------------------------------------------------===//
#include "Commands.h"

#include <algorithm>
#include <cstring>
#include <exception>
#include <iostream>

using namespace revbound::tool;

static const Command Commands[] = {
    {"report", "count, schedule and report circuits", setupReport},
    {"gates", "list the gate library: arity, parameters, class, angle", setupGates},
    {"check", "hold circuits to a budget and a baseline: the CI verdict", setupCheck},
    {"compare", "several circuits of one function side by side; --equivalence first", setupCompare},
};

int main(int argc, char **argv) {
  try {
    CLI::App App{"revbound: what physics says OpenQASM 2.0 circuits must cost"};
    App.set_version_flag("--version", "revbound " REVBOUND_VERSION);
    App.require_subcommand(1);
    std::vector<std::pair<CLI::App *, std::function<int()>>> Runners;
    for (const Command &C : Commands) {
      CLI::App *Sub = App.add_subcommand(C.Name, C.Help);
      Runners.push_back({Sub, C.Setup(*Sub)});
    }
    // Name an unknown command instead of CLI11's "a subcommand is required".
    if (argc > 1 && argv[1][0] != '-' &&
        std::none_of(std::begin(Commands), std::end(Commands),
                     [&](const Command &C) { return std::strcmp(C.Name, argv[1]) == 0; })) {
      std::cerr << "revbound: unknown command '" << argv[1]
                << "'; expected one of:";
      for (const Command &C : Commands)
        std::cerr << " " << C.Name;
      std::cerr << "\n";
      return ExitBadInput;
    }
    try {
      App.parse(argc, argv);
    } catch (const CLI::CallForHelp &E) {
      return App.exit(E);
    } catch (const CLI::CallForAllHelp &E) {
      return App.exit(E);
    } catch (const CLI::CallForVersion &E) {
      return App.exit(E);
    } catch (const CLI::ParseError &E) {
      App.exit(E);
      return ExitBadInput;
    }
    for (auto &[Sub, Runner] : Runners)
      if (Sub->parsed())
        return Runner();
    return ExitBadInput;
  } catch (const std::bad_alloc &) {
    std::cerr << "revbound: internal error: out of memory\n";
    return ExitInternal;
  } catch (const std::exception &E) {
    std::cerr << "revbound: internal error: " << E.what() << "\n";
    return ExitInternal;
  }
}
