# HandLine in a container: Debian 12 slim, the self-contained published folder (models inside), a non-root user,
# `handline` as the entry point, /data and /out as volumes. See docs/install.md#container.
#
#   dotnet publish src/HandLine.Cli -c Release -r linux-x64 --self-contained -o publish/linux-x64
#   docker build -t registry.example/handline:latest .
#
# Not built by the project's CI (its machines reach no image registry); tests/install/check-install.sh checks every
# path below against a real published folder.
FROM debian:12-slim

# ICU: Unicode normalisation (NFC) needs it, and globalisation stays on (DEVELOPERS.md). libstdc++, zlib and the
# C library that libtorch needs are in the base image; libtorch brings its own OpenMP runtime.
RUN apt-get update \
 && apt-get install -y --no-install-recommends libicu72 \
 && rm -rf /var/lib/apt/lists/*

# A numeric user, so that a cluster can check runAsNonRoot; the program files stay root's and read-only to it.
RUN groupadd --system --gid 10001 handline \
 && useradd --system --uid 10001 --gid 10001 --no-create-home --home-dir /nonexistent --shell /usr/sbin/nologin handline

COPY publish/linux-x64/ /opt/handline/
ENV PATH=/opt/handline:$PATH

VOLUME ["/data", "/out"]
WORKDIR /data
USER 10001:10001
ENTRYPOINT ["/opt/handline/handline"]
CMD ["--help"]
