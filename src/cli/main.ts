console.log("cli", process.argv.slice(2))
