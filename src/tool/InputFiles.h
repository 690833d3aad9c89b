//===- InputFiles.h - The files a command line names, folders expanded ----===//
//
// Internal to the driver. docs/formats.md ("Many files") states the rules.
//
//===----------------------------------------------------------------------===//
#ifndef REVBOUND_TOOL_INPUTFILES_H
#define REVBOUND_TOOL_INPUTFILES_H

#include "llvm/ADT/ArrayRef.h"
#include "llvm/Support/Error.h"

#include <string>
#include <vector>

namespace revbound::tool {

/// The files to analyse, in order. An argument that is a folder (a
/// symbolic link to one included: it was named) stands, at its position,
/// for the regular files whose names end in ".qasm" anywhere under it,
/// sorted by path bytewise so that the order is the same on every system;
/// symbolic links under it are not followed, so the walk never leaves it
/// and never loops. Other arguments stay as given ("-" is standard input;
/// a missing file fails later, as one failed file). Fails on a folder that
/// cannot be read or holds no .qasm file, and on "-" given twice (standard
/// input can be read once).
llvm::Expected<std::vector<std::string>>
expandInputs(llvm::ArrayRef<std::string> Args);

} // namespace revbound::tool

#endif
