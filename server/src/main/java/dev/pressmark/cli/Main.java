package dev.pressmark.cli;

import dev.pressmark.core.PressmarkException;
import java.io.PrintWriter;
import java.util.List;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * The {@code pressmark} command. Exit codes: 0 ok, 1 a failure the user can fix (one line on
 * stderr, a stack trace only with {@code --verbose}), 2 a usage error.
 */
@Command(
        name = "pressmark",
        mixinStandardHelpOptions = true,
        versionProvider = Main.Version.class,
        description = "Learn, evaluate, publish and serve short-text classifiers.")
public final class Main {

    static final int EXIT_OK = 0;
    static final int EXIT_FAILURE = 1;
    static final int EXIT_USAGE = 2;

    /** The subcommands, in the order the usage help lists them. */
    private static final List<Class<?>> COMMANDS = List.of(
            TrainCommand.class,
            EvaluateCommand.class,
            InspectCommand.class,
            PredictCommand.class,
            ReportCommand.class,
            VocabCommand.class,
            PublishCommand.class,
            VersionsCommand.class,
            ActivateCommand.class,
            RollbackCommand.class,
            RetireCommand.class,
            ShadowCommand.class,
            ShadowReportCommand.class,
            VerifyCommand.class,
            HistoryCommand.class,
            KeygenCommand.class,
            SignCommand.class,
            TrustCommand.class,
            ServeCommand.class,
            DemoCommand.class,
            CommandLine.HelpCommand.class);

    @Option(names = "--verbose", description = "Print stack traces of failures.", scope = CommandLine.ScopeType.INHERIT)
    boolean verbose;

    public static void main(String[] args) {
        System.exit(run(args));
    }

    /** Runs the command line and returns the exit code; the seam the tests use. */
    static int run(String... args) {
        CommandLine commandLine = commandLineFor(args);
        commandLine.setExecutionExceptionHandler(Main::handleFailure);
        try {
            return commandLine.execute(args);
        } catch (OutOfMemoryError e) {
            // what was being built is garbage once the command's frames are gone, so there is room for one line
            PrintWriter err = commandLine.getErr();
            err.println("pressmark: out of memory (" + e.getMessage() + ", maximum heap " + (Runtime.getRuntime().maxMemory() >> 20)
                    + " MiB): the input is too large for this heap; give the JVM more with -Xmx");
            err.flush();
            return EXIT_FAILURE;
        }
    }

    /** The whole command tree, every subcommand in it: what the usage help lists. */
    static CommandLine commandLine() {
        return withCommands(COMMANDS);
    }

    /**
     * The command tree that {@code args} need. picocli builds a subcommand's model by reflection
     * over its class, its options and its mixins; building all twenty cost 55-75 ms of every run
     * (docs/benchmarks.md, "Start-up"), so a run that names a subcommand gets that one alone. Anything
     * else (no subcommand, {@code help}, a name that is not a command) gets the whole tree, so
     * that usage help and picocli's suggestions for a mistyped name list every command.
     */
    static CommandLine commandLineFor(String... args) {
        String named = subcommandName(args);
        for (Class<?> type : COMMANDS) {
            if (type != CommandLine.HelpCommand.class && nameOf(type).equals(named)) {
                return withCommands(List.of(type));
            }
        }
        return commandLine();
    }

    private static CommandLine withCommands(List<Class<?>> commands) {
        CommandLine root = new CommandLine(new Main());
        for (Class<?> type : commands) {
            root.addSubcommand(nameOf(type), type);
        }
        return root;
    }

    private static String nameOf(Class<?> type) {
        return type.getAnnotation(Command.class).name();
    }

    /** The first argument that is not an option: the root command's options take no values. */
    private static String subcommandName(String... args) {
        for (String arg : args) {
            if (!arg.startsWith("-")) {
                return arg;
            }
        }
        return "";
    }

    private static int handleFailure(Exception e, CommandLine commandLine, CommandLine.ParseResult parseResult) {
        PrintWriter err = commandLine.getErr();
        boolean verbose = hasVerbose(parseResult);
        if (e instanceof PressmarkException || e instanceof IllegalArgumentException) {
            err.println("pressmark: " + e.getMessage());
        } else {
            err.println("pressmark: unexpected failure: " + e + (verbose ? "" : " (run with --verbose for details)"));
        }
        if (verbose) {
            e.printStackTrace(err);
        }
        err.flush();
        return EXIT_FAILURE;
    }

    private static boolean hasVerbose(CommandLine.ParseResult result) {
        for (CommandLine.ParseResult p = result; p != null; p = p.subcommand()) {
            if (p.matchedOption("--verbose") != null) {
                return true;
            }
        }
        return false;
    }

    /** The version from the jar's manifest, or "development" when run from classes. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String version = Main.class.getPackage().getImplementationVersion();
            return new String[] {"pressmark " + (version == null ? "development" : version)};
        }
    }
}
