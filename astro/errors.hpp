// Error types shared by every layer.
//
// Exceptions carry where the problem is (a file:line, an option name, an HDU or dataset), what is
// wrong, and what the user can do. The CLI catches siiplan::Error once, prints
//   siiplan: <where>: <what> (<hint>)
// and exits with exit_code(): 2 for bad input or usage (InputError), 1 for a runtime failure
// (RuntimeFailure: a disk that fills, a library that fails). Bugs are assertions, not these.
#pragma once

#include <stdexcept>
#include <string>

namespace siiplan {

class Error : public std::runtime_error {
 public:
  Error(int exit_code, std::string where, std::string what, std::string hint)
      : std::runtime_error(compose(where, what, hint)),
        exit_code_(exit_code), where_(std::move(where)), what_(std::move(what)), hint_(std::move(hint)) {}
  int exit_code() const { return exit_code_; }
  const std::string& where() const { return where_; }
  const std::string& problem() const { return what_; }
  const std::string& hint() const { return hint_; }

 private:
  static std::string compose(const std::string& where, const std::string& what, const std::string& hint) {
    std::string s;
    if (!where.empty()) s += where + ": ";
    s += what;
    if (!hint.empty()) s += " (" + hint + ")";
    return s;
  }
  int exit_code_;
  std::string where_, what_, hint_;
};

// Bad input or usage that the user can fix: exit code 2.
class InputError : public Error {
 public:
  InputError(std::string where, std::string what, std::string hint)
      : Error(2, std::move(where), std::move(what), std::move(hint)) {}
};

// A failure at run time that is not the input's fault (I/O failure, library error): exit code 1.
class RuntimeFailure : public Error {
 public:
  RuntimeFailure(std::string where, std::string what, std::string hint)
      : Error(1, std::move(where), std::move(what), std::move(hint)) {}
};

}  // namespace siiplan
