//===- bench_frontend.cpp - Throughput of lexing, parsing and elaboration -===//
//
// Three nested stages on the same in-memory flat buffer, so that their
// differences attribute the front end's time: the lexer alone, the parser
// into a sink that only counts, and the full elaboration into the IR.
//
//===----------------------------------------------------------------------===//
#include "BenchSupport.h"

#include "revbound/qasm/Frontend.h"
#include "revbound/qasm/Lexer.h"
#include "revbound/qasm/Parser.h"

#include <benchmark/benchmark.h>

namespace revbound::perf {
namespace {

void setThroughput(benchmark::State &State, size_t Bytes, uint64_t Ops) {
  State.SetBytesProcessed(int64_t(State.iterations()) * int64_t(Bytes));
  State.SetItemsProcessed(int64_t(State.iterations()) * int64_t(Ops));
}

/// Statements handed over by the parser, counted and dropped.
class CountingSink : public qasm::StatementSink {
public:
  uint64_t Statements = 0;
  llvm::Error onStatement(const qasm::Statement &) override {
    ++Statements;
    return llvm::Error::success();
  }
};

// Tokens of the flat file, nothing else.
void BM_Lex(benchmark::State &State) {
  uint64_t Ops = uint64_t(State.range(0));
  const std::string &Text = flatText(Ops);
  uint64_t Tokens = 0;
  for (auto _ : State) {
    qasm::Lexer L(Text);
    Tokens = 0;
    for (qasm::Token T = L.lex(); T.Kind != qasm::Tok::Eof; T = L.lex()) {
      if (T.Kind == qasm::Tok::Error) {
        State.SkipWithError(L.errorMessage().c_str());
        return;
      }
      ++Tokens;
    }
    benchmark::DoNotOptimize(Tokens);
  }
  setThroughput(State, Text.size(), Ops);
  State.counters["tokens"] = double(Tokens);
}
BENCHMARK(BM_Lex)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// Lexing and parsing (qelib1.inc included), statements dropped.
void BM_Parse(benchmark::State &State) {
  uint64_t Ops = uint64_t(State.range(0));
  const std::string &Text = flatText(Ops);
  for (auto _ : State) {
    State.PauseTiming();
    SourceFiles Files;
    unsigned Id = Files.addBuffer("flat.qasm", Text);
    DiagnosticSink Warnings;
    CountingSink Sink;
    State.ResumeTiming();
    llvm::Error E = qasm::parseProgram(Files, Id, qasm::ParserOptions(), Sink,
                                       Warnings);
    if (E) {
      llvm::consumeError(std::move(E));
      State.SkipWithError("parse failed");
      return;
    }
    benchmark::DoNotOptimize(Sink.Statements);
  }
  setThroughput(State, Text.size(), Ops);
}
BENCHMARK(BM_Parse)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// Lexing, parsing and elaboration into the IR: what `report` pays before
// any analysis.
void BM_Frontend(benchmark::State &State) {
  uint64_t Ops = uint64_t(State.range(0));
  const std::string &Text = flatText(Ops);
  for (auto _ : State) {
    State.PauseTiming();
    SourceFiles Files;
    unsigned Id = Files.addBuffer("flat.qasm", Text);
    DiagnosticSink Warnings;
    State.ResumeTiming();
    llvm::Expected<ir::Circuit> C =
        qasm::buildCircuit(Files, Id, qasm::FrontendOptions(), Warnings);
    if (!C) {
      llvm::consumeError(C.takeError());
      State.SkipWithError("elaboration failed");
      return;
    }
    benchmark::DoNotOptimize(C->Ops.data());
    State.PauseTiming(); // freeing the IR is not elaboration
    *C = ir::Circuit();
    State.ResumeTiming();
  }
  setThroughput(State, Text.size(), Ops);
}
BENCHMARK(BM_Frontend)->Arg(100'000)->Arg(1'000'000)->Unit(benchmark::kMillisecond);

// The nested file's front end: 61 definitions, a handful of statements.
void BM_FrontendNested(benchmark::State &State) {
  const std::string &Text = nestedText(unsigned(State.range(0)));
  for (auto _ : State) {
    SourceFiles Files;
    unsigned Id = Files.addBuffer("nested.qasm", Text);
    DiagnosticSink Warnings;
    llvm::Expected<ir::Circuit> C =
        qasm::buildCircuit(Files, Id, qasm::FrontendOptions(), Warnings);
    if (!C) {
      llvm::consumeError(C.takeError());
      State.SkipWithError("elaboration failed");
      return;
    }
    benchmark::DoNotOptimize(C->Gates.data());
  }
  State.SetBytesProcessed(int64_t(State.iterations()) * int64_t(Text.size()));
}
BENCHMARK(BM_FrontendNested)->Arg(61)->Unit(benchmark::kMicrosecond);

} // namespace
} // namespace revbound::perf
