# Read by ctest (TEST_INCLUDE_FILES): one ctest entry per Catch2 test case, so
# that `ctest -R name` selects and `ctest -j2` runs in parallel. Written here
# rather than with Catch's own discovery, whose CMake lists break on the
# unbalanced brackets of names such as "gravity outside (0, 30] m/s^2 ...".
execute_process(COMMAND "${PLUMB_TESTS_EXECUTABLE}" --list-test-names-only
                OUTPUT_VARIABLE listing RESULT_VARIABLE listed)
if(listed LESS 0 OR listing STREQUAL "")
  message(FATAL_ERROR "could not list the test cases of ${PLUMB_TESTS_EXECUTABLE}")
endif()
# Keep brackets and semicolons out of CMake's list handling until the end.
string(REPLACE "[" "<plumb-open>" listing "${listing}")
string(REPLACE "]" "<plumb-close>" listing "${listing}")
string(REPLACE ";" "<plumb-semicolon>" listing "${listing}")
string(REPLACE "\n" ";" names "${listing}")
foreach(name IN LISTS names)
  if(name STREQUAL "")
    continue()
  endif()
  # Catch's test spec treats , [ ] as syntax: escape them with a backslash.
  set(spec "${name}")
  string(REPLACE "," "\\," spec "${spec}")
  string(REPLACE "<plumb-open>" "\\[" spec "${spec}")
  string(REPLACE "<plumb-close>" "\\]" spec "${spec}")
  string(REPLACE "<plumb-open>" "[" name "${name}")
  string(REPLACE "<plumb-close>" "]" name "${name}")
  string(REPLACE "<plumb-semicolon>" ";" spec "${spec}")
  string(REPLACE "<plumb-semicolon>" ";" name "${name}")
  add_test("${name}" "${PLUMB_TESTS_EXECUTABLE}" "${spec}" --warn NoAssertions)
  set_tests_properties("${name}" PROPERTIES WORKING_DIRECTORY "${PLUMB_TESTS_WORKING_DIRECTORY}")
endforeach()
