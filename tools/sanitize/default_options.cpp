/// \file default_options.cpp
/// \brief Linked into terayee, terayee_tests and terayee_studies of the sanitizer build
/// (TERAYEE_SANITIZE, `SANITIZE=ON tools/setup.sh`) only: the sanitizers' runtime options
/// they start with. UndefinedBehaviorSanitizer prints a report and goes on by default, so a
/// test whose run hit undefined behaviour would still pass; here every report ends the
/// process with its stack (exit 1). The options live in each binary, so the `terayee`
/// children the tests start get them too. The checked-in suppressions (tools/sanitize/*.supp)
/// say why each entry is there. ASAN_OPTIONS, UBSAN_OPTIONS and LSAN_OPTIONS in the
/// environment still override these.

#ifndef TERAYEE_SANITIZE_DIR
#error "built only by the sanitizer build (CMakeLists.txt, TERAYEE_SANITIZE)"
#endif

extern "C" const char* __ubsan_default_options() {
  return "print_stacktrace=1:halt_on_error=1:suppressions=" TERAYEE_SANITIZE_DIR "/ubsan.supp";
}

extern "C" const char* __lsan_default_options() { return "suppressions=" TERAYEE_SANITIZE_DIR "/lsan.supp"; }
