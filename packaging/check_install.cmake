# SPDX-License-Identifier: GPL-3.0-or-later
# Test packaging.install_layout: `cmake --install` into a scratch prefix lays out the program, its data
# and the desktop files; the files agree with each other and with `ampwright --help`; and the
# installed program, run from another folder, finds its data under the prefix, not in the source tree.
#   cmake -DBUILD_DIR= -DSOURCE_DIR= -DSTAGE= -DPNG_ICONS=ON|OFF -DMANPAGE= -DCHANGELOG= -DVERSION=
#         -DDEB_RELEASE= -P check_install.cmake

set(_failures "")
macro(_fail msg)
  string(APPEND _failures "  - ${msg}\n")
endmacro()

file(REMOVE_RECURSE "${STAGE}")
file(MAKE_DIRECTORY "${STAGE}")
get_filename_component(STAGE "${STAGE}" REALPATH)
execute_process(COMMAND ${CMAKE_COMMAND} --install "${BUILD_DIR}" --prefix "${STAGE}"
  RESULT_VARIABLE _rc OUTPUT_VARIABLE _out ERROR_VARIABLE _err)
if(NOT _rc EQUAL 0)
  message(FATAL_ERROR "cmake --install failed (${_rc}):\n${_out}\n${_err}")
endif()

# 1. The layout (the data folders are where core/io/datapaths.cpp looks: <prefix>/share/ampwright).
set(_data share/ampwright)
set(_required
  bin/ampwright
  ${_data}/demos/garden-cart.ampw
  share/applications/ampwright.desktop
  share/icons/hicolor/scalable/apps/ampwright.svg
  share/mime/packages/ampwright.xml
  share/metainfo/org.ampwright.Ampwright.metainfo.xml
  share/man/man1/ampwright.1.gz
  share/doc/ampwright/copyright
  share/doc/ampwright/changelog.Debian.gz)
if(PNG_ICONS)
  foreach(_size 16 32 48 64 128 256)
    list(APPEND _required share/icons/hicolor/${_size}x${_size}/apps/ampwright.png)
  endforeach()
endif()
foreach(_f IN LISTS _required)
  if(NOT EXISTS "${STAGE}/${_f}")
    _fail("not installed: ${_f}")
  endif()
endforeach()
if(NOT IS_DIRECTORY "${STAGE}/${_data}/resources")
  _fail("not installed: ${_data}/resources/")
endif()

# Every shipped part and demo of the source tree is installed.
file(GLOB_RECURSE _parts RELATIVE "${SOURCE_DIR}/parts" "${SOURCE_DIR}/parts/*.json")
file(GLOB _demos RELATIVE "${SOURCE_DIR}/resources/demos" "${SOURCE_DIR}/resources/demos/*.ampw")
if(NOT _parts)
  _fail("the source tree has no parts/*.json to ship")
endif()
foreach(_p IN LISTS _parts)
  if(NOT EXISTS "${STAGE}/${_data}/parts/${_p}")
    _fail("part not installed: parts/${_p}")
  endif()
endforeach()
foreach(_d IN LISTS _demos)
  if(NOT EXISTS "${STAGE}/${_data}/demos/${_d}")
    _fail("demo not installed: resources/demos/${_d}")
  endif()
endforeach()

# 2. The desktop entry, the MIME type and the AppStream metadata name each other consistently.
set(_mime application/x-ampwright-design)
if(EXISTS "${STAGE}/share/applications/ampwright.desktop")
  file(READ "${STAGE}/share/applications/ampwright.desktop" _desktop)
  foreach(_line "Exec=ampwright %f" "Icon=ampwright" "MimeType=${_mime};" "Type=Application")
    string(FIND "${_desktop}" "\n${_line}\n" _at)
    if(_at LESS 0)
      _fail("ampwright.desktop lacks the line '${_line}'")
    endif()
  endforeach()
endif()
if(EXISTS "${STAGE}/share/mime/packages/ampwright.xml")
  file(READ "${STAGE}/share/mime/packages/ampwright.xml" _xml)
  if(NOT _xml MATCHES "<mime-type type=\"${_mime}\">" OR NOT _xml MATCHES "<glob pattern=\"\\*\\.ampw\"/>"
     OR NOT _xml MATCHES "<sub-class-of type=\"application/json\"/>")
    _fail("ampwright.xml does not declare ${_mime} for *.ampw as a sub-class of application/json")
  endif()
endif()
set(_metainfo "${STAGE}/share/metainfo/org.ampwright.Ampwright.metainfo.xml")
if(EXISTS "${_metainfo}")
  file(READ "${_metainfo}" _xml)
  if(NOT _xml MATCHES "<launchable type=\"desktop-id\">ampwright.desktop</launchable>")
    _fail("the metainfo's launchable is not ampwright.desktop")
  endif()
  if(NOT _xml MATCHES "<mediatype>${_mime}</mediatype>")
    _fail("the metainfo does not provide ${_mime}")
  endif()
  # The newest release listed must be this version.
  if(NOT _xml MATCHES "<release version=\"([^\"]+)\"" OR NOT CMAKE_MATCH_1 STREQUAL VERSION)
    _fail("the metainfo's newest release is '${CMAKE_MATCH_1}', the project is ${VERSION}")
  endif()
endif()
file(STRINGS "${CHANGELOG}" _top LIMIT_COUNT 1)
if(NOT _top MATCHES "^ampwright \\(${VERSION}-${DEB_RELEASE}\\) ")
  _fail("changelog.Debian's top entry '${_top}' is not version ${VERSION}-${DEB_RELEASE}")
endif()

# 3. The manual page names every command and option of `ampwright --help`, and groff renders it cleanly.
execute_process(COMMAND "${STAGE}/bin/ampwright" --help RESULT_VARIABLE _rc OUTPUT_VARIABLE _help
  ERROR_VARIABLE _err)
if(NOT _rc EQUAL 0)
  _fail("installed ampwright --help exited ${_rc}: ${_err}")
endif()
file(READ "${MANPAGE}" _man)
if(NOT _man MATCHES "\n\\.TH AMPWRIGHT 1 \"[^\"]*\" \"ampwright ${VERSION}\"")
  _fail("the manual page's .TH line does not carry version ${VERSION}")
endif()
string(REGEX MATCH "\nCommands:\n(  [^\n]*\n|    [^\n]*\n)*" _commands "${_help}")
string(REGEX MATCHALL "\n  [a-z][a-z-]*" _commands "${_commands}")
if(NOT _commands)
  _fail("ampwright --help lists no command")
endif()
foreach(_c IN LISTS _commands)
  string(STRIP "${_c}" _c)
  string(FIND "${_man}" "\n.TP\n\\fB${_c}\\fR" _at)
  if(_at LESS 0)
    _fail("the manual page has no entry for the command '${_c}'")
  endif()
endforeach()
string(REGEX MATCHALL "(^|[ ,])--?[a-z][a-z-]*" _options "${_help}")
list(REMOVE_DUPLICATES _options)
foreach(_o IN LISTS _options)
  string(REGEX REPLACE "^[ ,]" "" _o "${_o}")
  string(REPLACE "-" "\\-" _o "${_o}")
  string(FIND "${_man}" "\\fB${_o}\\fR" _bold)
  string(FIND "${_man}" "${_o}" _plain)
  if(_bold LESS 0 AND _plain LESS 0)
    _fail("the manual page does not mention the option '${_o}'")
  endif()
endforeach()
find_program(_groff groff)
if(_groff)
  execute_process(COMMAND ${_groff} -man -Tutf8 -ww -z "${MANPAGE}" RESULT_VARIABLE _rc ERROR_VARIABLE _err)
  if(NOT _rc EQUAL 0 OR NOT _err STREQUAL "")
    _fail("groff warns about the manual page: ${_err}")
  endif()
endif()

# 4. The installed program run from another folder, without a display: the headless run opens the
#    installed demo (its path is printed), and `evaluate` writes the results JSON.
set(_run "${STAGE}-run")
file(REMOVE_RECURSE "${_run}")
file(MAKE_DIRECTORY "${_run}")
set(_headless ${CMAKE_COMMAND} -E env --unset=DISPLAY --unset=WAYLAND_DISPLAY --unset=QT_QPA_PLATFORM)
execute_process(COMMAND ${_headless} "${STAGE}/bin/ampwright" WORKING_DIRECTORY "${_run}"
  RESULT_VARIABLE _rc OUTPUT_VARIABLE _out ERROR_VARIABLE _err)
string(FIND "${_out}" "${STAGE}/${_data}/demos/garden-cart.ampw" _at)
if(NOT _rc EQUAL 0 OR _at LESS 0)
  _fail("the installed program did not evaluate ${STAGE}/${_data}/demos/garden-cart.ampw headless "
        "(exit ${_rc}):\n${_out}${_err}")
endif()
if(NOT EXISTS "${_run}/garden-cart-results.json")
  _fail("the headless run wrote no garden-cart-results.json in its working folder")
endif()
execute_process(COMMAND ${_headless} "${STAGE}/bin/ampwright" evaluate "${STAGE}/${_data}/demos/garden-cart.ampw"
                        --json "${_run}/x.json" --quiet
  WORKING_DIRECTORY "${_run}" RESULT_VARIABLE _rc OUTPUT_VARIABLE _out ERROR_VARIABLE _err)
if(NOT _rc EQUAL 0 OR NOT EXISTS "${_run}/x.json")
  _fail("ampwright evaluate on the installed demo failed (exit ${_rc}): ${_out}${_err}")
else()
  file(READ "${_run}/x.json" _json)
  if(NOT _json MATCHES "\"operatingPoints\"")
    _fail("the results JSON of the installed demo has no operatingPoints")
  endif()
endif()

if(_failures)
  message(FATAL_ERROR "install layout check failed:\n${_failures}")
endif()
message(STATUS "install layout under ${STAGE}: all checks passed")
