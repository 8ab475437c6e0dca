#!/usr/bin/env bash
# Packs the scalegen .NET tool from this checkout and installs it from the local package
# folder only: no package feed is asked, so it works offline.
#
#   tools/install-local-tool.sh [TOOL_PATH] [PACKAGE_DIR]
#
# TOOL_PATH    where the tool goes (default: .tools); run it as TOOL_PATH/scalegen
# PACKAGE_DIR  where `dotnet pack` puts ScaleGen.Tool.<version>.nupkg (default: artifacts)
#
# For a tool on the PATH instead, install the packed package globally:
#   dotnet tool install --global --add-source artifacts ScaleGen.Tool --version <version>
set -euo pipefail
root="$(cd "$(dirname "$0")/.." && pwd)"
tool_path="$(realpath -m "${1:-$root/.tools}")"
package_dir="$(realpath -m "${2:-$root/artifacts}")"

# No build servers: they would outlive this script and hold a caller's output pipes open.
version="$(dotnet msbuild "$root/src/ScaleGen.Cli/ScaleGen.Cli.csproj" -getProperty:Version -nodeReuse:false)"
dotnet pack "$root/src/ScaleGen.Cli/ScaleGen.Cli.csproj" -c Release -o "$package_dir" --nologo -v quiet --disable-build-servers

# A private NuGet config with no feeds and a private package cache: the tool comes from
# PACKAGE_DIR alone, and an older package of the same version cached elsewhere cannot win.
scratch="$(mktemp -d)"
trap 'rm -rf "$scratch"' EXIT
cat > "$scratch/nuget.config" <<'XML'
<?xml version="1.0" encoding="utf-8"?>
<configuration>
  <packageSources>
    <clear />
  </packageSources>
</configuration>
XML

# Replace an earlier install in the same tool path.
if [ -x "$tool_path/scalegen" ]; then
  dotnet tool uninstall --tool-path "$tool_path" ScaleGen.Tool >/dev/null
fi
NUGET_PACKAGES="$scratch/packages" dotnet tool install --tool-path "$tool_path" \
  --configfile "$scratch/nuget.config" --add-source "$package_dir" ScaleGen.Tool --version "$version"
echo "installed scalegen $version: $tool_path/scalegen"
