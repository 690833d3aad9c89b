//===- InputFiles.cpp - The files a command line names, folders expanded --===//
#include "InputFiles.h"

#include <algorithm>
#include <filesystem>
#include <system_error>

namespace revbound::tool {

namespace fs = std::filesystem;

static llvm::Error folderError(const fs::path &Dir, const std::string &Why) {
  return llvm::createStringError(llvm::inconvertibleErrorCode(),
                                 "folder '%s' %s", Dir.string().c_str(),
                                 Why.c_str());
}

/// Appends the .qasm files under `Root`, sorted. An explicit stack rather
/// than recursion: folder depth is not bounded by us.
static llvm::Error addFolder(const fs::path &Root,
                             std::vector<std::string> &Out) {
  std::vector<std::string> Found;
  std::vector<fs::path> Todo{Root};
  while (!Todo.empty()) {
    fs::path Dir = std::move(Todo.back());
    Todo.pop_back();
    std::error_code EC;
    fs::directory_iterator It(Dir, EC);
    for (; !EC && It != fs::directory_iterator(); It.increment(EC)) {
      // symlink_status: a link is neither a folder nor a regular file here.
      fs::file_status S = It->symlink_status(EC);
      if (EC)
        break;
      if (fs::is_directory(S))
        Todo.push_back(It->path());
      else if (fs::is_regular_file(S) && It->path().extension() == ".qasm")
        Found.push_back(It->path().string());
    }
    if (EC)
      return folderError(Dir, "cannot be read: " + EC.message());
  }
  if (Found.empty())
    return folderError(Root, "holds no .qasm files");
  // std::string compares as unsigned bytes (char_traits<char>::lt).
  std::sort(Found.begin(), Found.end());
  Out.insert(Out.end(), std::make_move_iterator(Found.begin()),
             std::make_move_iterator(Found.end()));
  return llvm::Error::success();
}

llvm::Expected<std::vector<std::string>>
expandInputs(llvm::ArrayRef<std::string> Args) {
  std::vector<std::string> Out;
  bool SawStdin = false;
  for (const std::string &Arg : Args) {
    if (Arg == "-") {
      if (SawStdin)
        return llvm::createStringError(
            llvm::inconvertibleErrorCode(),
            "standard input ('-') is named twice; it can be read only once");
      SawStdin = true;
      Out.push_back(Arg);
      continue;
    }
    std::error_code EC;
    if (fs::is_directory(Arg, EC)) {
      if (llvm::Error E = addFolder(Arg, Out))
        return E;
    } else {
      Out.push_back(Arg);
    }
  }
  return Out;
}

} // namespace revbound::tool
