# The installed library: a shared library with a versioned SONAME (built from the static library's
# objects, so nothing is compiled twice), the static one, the headers, the component library,
# pinchwise.pc for pkg-config and a CMake package (find_package(pinchwise), target
# pinchwise::pinchwise; pinchwise::pinchwise_static for static linking).
include(CMakePackageConfigHelpers)

# While the major version is 0 every minor release may change the ABI (common practice).
if(PROJECT_VERSION_MAJOR EQUAL 0)
  set(PW_SOVERSION "${PROJECT_VERSION_MAJOR}.${PROJECT_VERSION_MINOR}")
else()
  set(PW_SOVERSION "${PROJECT_VERSION_MAJOR}")
endif()

add_library(pinchwise_shared SHARED $<TARGET_OBJECTS:pinchwise_lib>)
set_target_properties(pinchwise_shared PROPERTIES OUTPUT_NAME pinchwise EXPORT_NAME pinchwise
  VERSION ${PROJECT_VERSION} SOVERSION ${PW_SOVERSION})
target_include_directories(pinchwise_shared
  PUBLIC $<BUILD_INTERFACE:${CMAKE_CURRENT_SOURCE_DIR}/include> $<INSTALL_INTERFACE:${CMAKE_INSTALL_INCLUDEDIR}>)
# GSL and jansson headers appear in the public headers (uncertainty.h, fitjson.h).
target_link_libraries(pinchwise_shared PUBLIC GSL::gsl Jansson::Jansson
  PRIVATE LAPACKE::LAPACKE ${LAPACK_LIBRARIES} CSV::CSV PkgConfig::MD m)
set_target_properties(pinchwise_lib PROPERTIES EXPORT_NAME pinchwise_static)
# The program is exported too (pinchwise::cli), so the library can take the plain name.
set_target_properties(pinchwise PROPERTIES EXPORT_NAME cli)

install(TARGETS pinchwise_shared EXPORT pinchwiseTargets
  LIBRARY DESTINATION ${CMAKE_INSTALL_LIBDIR} NAMELINK_COMPONENT Development)

set(PW_CMAKE_DIR ${CMAKE_INSTALL_LIBDIR}/cmake/pinchwise)
configure_package_config_file(${CMAKE_CURRENT_SOURCE_DIR}/cmake/pinchwiseConfig.cmake.in
  ${CMAKE_CURRENT_BINARY_DIR}/pinchwiseConfig.cmake INSTALL_DESTINATION ${PW_CMAKE_DIR})
write_basic_package_version_file(${CMAKE_CURRENT_BINARY_DIR}/pinchwiseConfigVersion.cmake
  VERSION ${PROJECT_VERSION} COMPATIBILITY SameMinorVersion)
install(FILES ${CMAKE_CURRENT_BINARY_DIR}/pinchwiseConfig.cmake
  ${CMAKE_CURRENT_BINARY_DIR}/pinchwiseConfigVersion.cmake
  ${CMAKE_CURRENT_SOURCE_DIR}/cmake/FindCSV.cmake ${CMAKE_CURRENT_SOURCE_DIR}/cmake/FindJansson.cmake
  ${CMAKE_CURRENT_SOURCE_DIR}/cmake/FindLAPACKE.cmake
  DESTINATION ${PW_CMAKE_DIR})

# pkg-config: relative to the .pc file's own folder, so an installed tree can be moved.
file(RELATIVE_PATH PW_PC_TO_PREFIX /${CMAKE_INSTALL_LIBDIR}/pkgconfig /)
string(REGEX REPLACE "/$" "" PW_PC_TO_PREFIX "${PW_PC_TO_PREFIX}")
configure_file(${CMAKE_CURRENT_SOURCE_DIR}/cmake/pinchwise.pc.in ${CMAKE_CURRENT_BINARY_DIR}/pinchwise.pc @ONLY)
install(FILES ${CMAKE_CURRENT_BINARY_DIR}/pinchwise.pc DESTINATION ${CMAKE_INSTALL_LIBDIR}/pkgconfig)

# The Python module, beside the library it loads (<libdir>/python3/dist-packages/pinchwise finds
# <libdir>/libpinchwise.so): PYTHONPATH=<libdir>/python3/dist-packages.
install(DIRECTORY python/pinchwise DESTINATION ${CMAKE_INSTALL_LIBDIR}/python3/dist-packages
  PATTERN "__pycache__" EXCLUDE)
