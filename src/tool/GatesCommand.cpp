//===- GatesCommand.cpp - `revbound gates [FILE]` -------------------------===//
#include "Commands.h"

namespace revbound::tool {

std::function<int()> setupGates(CLI::App &Cmd) {
  return [] { return ExitInternal; };
}

} // namespace revbound::tool
